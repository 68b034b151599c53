/// <reference lib="webworker" />
/**
 * The engine in a Web Worker, for the value knob. While a value turns only what the live
 * views show is computed: the chain is built and its node analysis run over the sweep
 * (thinned to at most 401 points) and at f0, giving the sweep the main plots draw and the
 * f0 figures (gain, noise figure, sensitivity) — no resonance search, selectivity or flags,
 * which the server's full analysis supplies once the value is released (nor the detector's
 * drive-level settling). The saved result stays the server's; this answer is only for the
 * live views.
 */
import { buildChain } from '../../../../../shared/engine/core/build';
import { runNodeAnalysis } from '../../../../../shared/engine/core/nodes';
import { stepUp } from '../../../../../shared/engine/core/quantities';
import {
  levelsReport,
  nodeReports,
  stageReports,
  sweepReport,
} from '../../../../../shared/engine/core/reports';
import { frequencyGrid } from '../../../../../shared/engine/core/sweep';
import { defaultCatalogue } from '../../../../../shared/engine/default-catalogue';
import { parseChainDocument } from '../../../../../shared/schema/parse-chain';
import type { KnobAnswer, KnobQuestion } from './knob-messages';

const LIVE_POINTS = 401;

addEventListener('message', ({ data }: MessageEvent<KnobQuestion>) => {
  const started = performance.now();
  try {
    // The editor's document as the engine takes it: parsed, with the schema's defaults.
    const doc = parseChainDocument(data.document);
    const sweep = doc.settings.sweep;
    const built = buildChain(doc, defaultCatalogue());
    const freqs = frequencyGrid({ ...sweep, points: Math.min(sweep.points, LIVE_POINTS) });
    const na = runNodeAnalysis(built, freqs);
    const flat = built.userNodeFlat[built.userNodeFlat.length - 1];
    const db = Array.from(freqs, (_, i) => 20 * Math.log10(stepUp(na, flat, i)));
    let peak = 0;
    for (let i = 1; i < db.length; i++) if (db[i] > db[peak]) peak = i;
    // −3 dB edges by linear interpolation on the live grid.
    const level = db[peak] - 3.0103;
    const edge = (dir: 1 | -1): number | null => {
      for (let i = peak; i + dir >= 0 && i + dir < db.length; i += dir) {
        if (db[i + dir] <= level) {
          const t = (db[i] - level) / (db[i] - db[i + dir]);
          return freqs[i] + t * (freqs[i + dir] - freqs[i]);
        }
      }
      return null;
    };
    const lo = edge(-1);
    const hi = edge(1);
    const atF0 = runNodeAnalysis(built, [doc.settings.f0Hz]);
    const stages = stageReports(built, atF0);
    const live = {
      sweep: sweepReport(built, na),
      nodes: nodeReports(built, atF0),
      stages,
      levels: levelsReport(built, atF0, stages),
    };
    const answer: KnobAnswer = {
      id: data.id,
      ok: true,
      freqsHz: Array.from(freqs),
      stepUpDb: db,
      peakHz: db.length ? freqs[peak] : null,
      bw3dbHz: lo !== null && hi !== null ? hi - lo : null,
      stepUpAtF0Db: 20 * Math.log10(stepUp(atF0, flat, 0)),
      live,
      ms: performance.now() - started,
    };
    postMessage(answer);
  } catch (e) {
    postMessage({ id: data.id, ok: false, message: e instanceof Error ? e.message : String(e) });
  }
});
