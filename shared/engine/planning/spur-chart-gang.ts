/**
 * The spur chart of a chain whose tuning is marked on it (a gang of variable values,
 * `settings.variables`): instead of assuming a preselector that tracks the dial at constant
 * Q, the gang is turned as a band study turns it (linearly in value from minimum to maximum)
 * and the chain is analysed as tuned at each position. The dial frequency of a position is
 * where the response at the mixer's input peaks (what the preselector passes best), the LO
 * follows it on the mixer's side (fLO = f ± fIF), and each response is judged through that
 * position's own selectivity, so mistracking and a Q that changes across the band count.
 */
import type { ChainDocument } from '../../schema/chain';
import type { BuiltChain } from '../core/build';
import { defaultCatalogue } from '../default-catalogue';
import { describeGang, gangMembers, gangValues } from '../gang';
import { findMixer, type MixerInfo } from '../core/selectivity';
import { passbandPeak } from '../design/passband-peak';
import { chartLines, judgePosition, selectivityAhead, type SpurChart, type SpurOptions } from './spurs'; // prettier-ignore

/** What the analysis hands the plan so it can re-tune the chain by its marked gang. */
export interface GangTuning {
  /** How the chart names the gang, e.g. `preselector.c 40 pF…400 pF`. */
  description: string;
  /** The chain built with the gang at dial setting 0…1. */
  rebuild(dial: number): BuiltChain;
}

/** Gang positions charted (a plan answers within the analysis's time budget). */
export const GANG_CHART_POSITIONS = 21;

/**
 * Spurious responses across the gang's travel. `searchHz` is where the preselector's peak is
 * looked for (the sweep and the tuning range, widened).
 */
export function spurChartByGang(
  mixer: MixerInfo,
  mixerNode: number,
  opts: SpurOptions,
  tuning: GangTuning,
  searchHz: readonly [number, number],
  positions = GANG_CHART_POSITIONS,
): SpurChart {
  const above = mixer.loHz > mixer.fInHz;
  const tuned: { dialHz: number; built: BuiltChain; mixer: MixerInfo }[] = [];
  for (let k = 0; k < positions; k++) {
    const built = tuning.rebuild(k / (positions - 1));
    const m = findMixer(built);
    const peak = m ? passbandPeak(built, mixerNode, searchHz[0], searchHz[1]) : null;
    if (m && peak) tuned.push({ dialHz: peak.peakHz, built, mixer: m });
  }
  tuned.sort((a, b) => a.dialHz - b.dialHz);
  const dialHz = tuned.map((t) => t.dialHz);
  const chart = chartLines(mixer, opts, dialHz, above);
  for (const p of chart.positions) {
    const t = tuned[p.k];
    const sel = mixer.product === 'difference' ? selectivityAhead(t.built, t.mixer, p.dialHz, p.rfHz) : []; // prettier-ignore
    judgePosition(p, sel);
  }
  return {
    dialHz,
    loSide: above ? 'above' : 'below',
    lines: chart.lines,
    tuning: 'gang',
    note:
      `Preselector tuned by the chain's gang (${tuning.description}) at ${positions} positions: ` +
      'each dial frequency is where the response at the mixer input peaks, and each response is judged through the chain as tuned there.', // prettier-ignore
  };
}

/**
 * The gang tuning of a chain document, for its plan: null when the chain marks no variable
 * value (the chart then assumes constant-Q tracking). Uses the first gang marked.
 */
export function gangTuningOf(
  doc: ChainDocument,
  build: (doc: ChainDocument) => BuiltChain,
): GangTuning | null {
  const members = gangMembers(doc, undefined);
  if (members.length === 0) return null;
  return {
    description: describeGang(members, (m) => {
      const type = doc.stages.find((s) => s.id === m.stageId)?.type;
      const spec = defaultCatalogue()
        .find((d) => d.type === type)
        ?.params.find((p) => p.key === m.key);
      return spec?.kind === 'number' ? spec.unit : 'none';
    }),
    rebuild(dial) {
      const values = gangValues(members, dial);
      const stages = doc.stages.map((s) => {
        const mine = values.filter((v) => v.stageId === s.id);
        if (mine.length === 0) return s;
        const next = { ...s.values };
        for (const v of mine) next[v.key] = v.value;
        return { ...s, values: next };
      });
      return build({ ...doc, stages });
    },
  };
}
