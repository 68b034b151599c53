/**
 * Tuning across a band. A gang turns every member (a capacitor or inductor value of a stage)
 * from its minimum to its maximum together, linearly in value over the dial (a straight-line
 * capacitance gang). At each of N dial positions the chain is analysed at the dial frequency:
 * - with an oscillator tank (superhet), the LO is that tank's resonance and the dial reads
 *   fLO − fIF (high-side LO) or fLO + fIF (low side); the mixer is fed that LO;
 * - without one, the dial reads the resonance of the first member's tuned circuit.
 * Each tuned circuit's resonance is compared with the dial frequency (tracking error) and
 * flagged where it is off by more than a fraction of its own bandwidth.
 *
 * The first position is analysed in full (its tuned circuits found on a grid); from there each
 * circuit is followed from where it was at the position before (trial.ts), which gives the
 * same figures without searching the whole chain again at every position. A position where a
 * circuit cannot be followed is analysed in full.
 */
import type { ChainDocument } from '../../schema/chain';
import type { BandSpec, GangMember, OscillatorTank } from '../../schema/studies';
import { buildChain, type BuiltChain } from '../core/build';
import { settleLoadLevel } from '../core/load-level';
import { runNodeAnalysis } from '../core/nodes';
import { analyzeResonators } from '../core/resonators';
import { frequencyGrid } from '../core/sweep';
import { defaultCatalogue } from '../default-catalogue';
import { analyzeChain } from '../index';
import { gangMembers } from '../gang';
import type { AnalysisResult } from '../types';
import { cloneForEdit, readValue, StudySetupError, writeValue } from './chain-values';
import type { StudyInputs } from './monte-carlo';
import {
  followResonators,
  judgedFigures,
  movedTracker,
  trialTracker,
  type FollowedResonator,
  type JudgedFigures,
  type TrialTracker,
} from './trial';

export interface BandCircuit {
  stageId: string;
  label: string;
  /** Whether the circuit's stage holds a gang member. */
  ganged: boolean;
}

export interface BandPosition {
  /** Dial setting 0…1 (0 = every member at its minimum). */
  dial: number;
  dialHz: number;
  loHz: number | null;
  /** Per circuit (same order as `circuits`). */
  resonanceHz: (number | null)[];
  trackingErrorHz: (number | null)[];
  loadedQ: (number | null)[];
  bandwidthHz: (number | null)[];
  mistracked: boolean[];
  gainDb: number | null;
  noiseFigureDb: number | null;
  imageRejectionDb: number | null;
  /** −3 dB width at the last node. */
  bandwidth3dbHz: number | null;
}

export interface BandResult {
  circuits: BandCircuit[];
  positions: BandPosition[];
  /** Positions with at least one ganged circuit flagged. */
  mistrackedPositions: number;
  worstTrackingErrorHz: number | null;
  mistrackFraction: number;
}

const TWO_PI = 2 * Math.PI;
const fin = (v: number | null | undefined) =>
  v === null || v === undefined || !Number.isFinite(v) ? null : v;

/** The oscillator's capacitance: (section + trimmer) in series with the padder (0 = none). */
export function oscillatorCapacitance(section: number, osc: OscillatorTank): number {
  const c = section + osc.trimmer;
  return osc.padder > 0 ? (c * osc.padder) / (c + osc.padder) : c;
}

/** Resonance of the oscillator tank at a gang section value. */
export function oscillatorHz(section: number, osc: OscillatorTank): number {
  return 1 / (TWO_PI * Math.sqrt(osc.l * oscillatorCapacitance(section, osc)));
}

interface MixerSetting {
  stageId: string;
  ifHz: number;
  side: 'high' | 'low';
}

function findDownMixer(doc: ChainDocument): MixerSetting | null {
  for (const s of doc.stages) {
    if (s.type !== 'mixer') continue;
    const v = s.values;
    if ((v.loSource ?? 'from-if') !== 'from-if' || (v.conversion ?? 'down') !== 'down') continue;
    return {
      stageId: s.id,
      ifHz: Number(v.ifHz ?? 455e3),
      side: v.side === 'low' ? 'low' : 'high',
    };
  }
  return null;
}

/**
 * The gang a band study turns: the spec's own members, or else the chain's variable marks of
 * the spec's gang group (the first gang marked by default).
 */
export function bandGang(doc: ChainDocument, spec: BandSpec): GangMember[] {
  if (spec.gang) return spec.gang;
  const marked = gangMembers(doc, spec.gangGroup);
  if (marked.length === 0) {
    throw new StudySetupError(
      spec.gangGroup
        ? `the chain has no variable value in gang "${spec.gangGroup}": mark one in the editor, or list the gang in the study`
        : 'the chain has no variable value: mark a tuning capacitor (or inductor) as variable in the editor, or list the gang in the study',
    );
  }
  return marked;
}

/** Checks the spec against the chain (members exist, ranges make sense). */
export function checkBandSpec(inputs: StudyInputs, spec: BandSpec): void {
  for (const m of bandGang(inputs.doc, spec)) {
    readValue(inputs.doc, m);
    if (!(m.max > m.min)) {
      throw new StudySetupError(
        `gang member ${m.stageId}.${m.key}: the maximum must be above the minimum`,
      );
    }
  }
  if (spec.oscillator && !findDownMixer(inputs.doc)) {
    throw new StudySetupError(
      'an oscillator tank needs a down-converting mixer whose LO is set from the IF and side',
    );
  }
}

function setDial(doc: ChainDocument, fHz: number, points: number, span: number): void {
  doc.settings.f0Hz = fHz;
  doc.settings.sweep = { startHz: fHz / span, stopHz: fHz * span, points, scale: 'lin' };
}

function analyseAt(
  inputs: StudyInputs,
  doc: ChainDocument,
  fHz: number,
  points: number,
  span = 1.25,
): AnalysisResult {
  setDial(doc, fHz, points, span);
  return analyzeChain(doc, { sweep: false, dataFiles: inputs.dataFiles });
}

/** The chain at dial frequency fHz, built (like `like`) with its load level settled. */
function builtAt(
  inputs: StudyInputs,
  doc: ChainDocument,
  fHz: number,
  points: number,
  like?: BuiltChain,
): { chain: BuiltChain; settled: BuiltChain } {
  setDial(doc, fHz, points, 1.25);
  const chain = buildChain(doc, defaultCatalogue(), { dataFiles: inputs.dataFiles, like });
  return { chain, settled: settleLoadLevel(chain) };
}

/** Figures per circuit and at the last node, however a position was worked out. */
interface PositionFigures {
  circuits: Pick<FollowedResonator, 'resonanceHz' | 'loadedQ'>[];
  judged: JudgedFigures;
}

/** A position's figures from a full analysis (circuits matched by stage, in order). */
function fromResult(result: AnalysisResult, circuits: BandCircuit[]): PositionFigures {
  const last = result.selectivity[result.selectivity.length - 1];
  return {
    circuits: circuits.map((c, i) => {
      const r = result.resonators.filter((x) => x.stageId === c.stageId)[countBefore(circuits, i)];
      return { resonanceHz: fin(r?.resonanceHz), loadedQ: fin(r?.loadedQ) };
    }),
    judged: {
      peakHz: fin(last?.peakHz),
      bw3dbHz: fin(last?.bw3dbHz),
      imageRejectionDb: fin(last?.imageRejectionDb),
      gainDb: fin(result.levels.totalGainDb),
      noiseFigureDb: fin(result.levels.noiseFigureDb),
    },
  };
}

/** Runs the band study; `onPosition` reports each finished position (progress). */
export function runBandStudy(
  inputs: StudyInputs,
  spec: BandSpec,
  onPosition?: (done: number, total: number, p: BandPosition) => void,
): BandResult {
  checkBandSpec(inputs, spec);
  const gang = bandGang(inputs.doc, spec);
  const mixer = spec.oscillator ? findDownMixer(inputs.doc) : null;
  const gangStages = new Set(gang.map((m) => m.stageId));
  const first = gang[0];
  const lastNode = inputs.doc.stages.length - 2;
  let circuits: BandCircuit[] | null = null;
  let tracker: TrialTracker | null = null;
  let guessHz = inputs.doc.settings.f0Hz;
  const positions: BandPosition[] = [];
  for (let k = 0; k < spec.positions; k++) {
    const dial = k / (spec.positions - 1);
    const doc = cloneForEdit(inputs.doc);
    for (const m of gang) writeValue(doc, m, m.min + dial * (m.max - m.min));
    let loHz: number | null = null;
    let dialHz: number | null = null;
    let figures: PositionFigures | null = null;
    if (spec.oscillator && mixer) {
      const osc = spec.oscillator;
      const section =
        (osc.min ?? first.min) + dial * ((osc.max ?? first.max) - (osc.min ?? first.min));
      loHz = oscillatorHz(section, osc);
      dialHz = mixer.side === 'high' ? loHz - mixer.ifHz : loHz + mixer.ifHz;
      if (!(dialHz > 0)) {
        throw new StudySetupError(
          `at dial ${dial.toFixed(2)} the LO (${loHz.toFixed(0)} Hz) is below the IF: check the oscillator coil and padder`,
        );
      }
      const mix = doc.stages.find((s) => s.id === mixer.stageId)!;
      mix.values.loSource = 'frequency';
      mix.values.loHz = loHz;
    } else if (tracker && circuits) {
      // The dial reads the first member's circuit, followed from where it was.
      const ref = circuits.findIndex((c) => c.stageId === first.stageId);
      if (ref >= 0) {
        const { settled } = builtAt(inputs, doc, guessHz, spec.points, tracker.nominal);
        const one = { ...tracker, follow: [tracker.follow[ref]] };
        dialHz = followResonators(settled, one)[0].resonanceHz;
      }
    }
    if (tracker && circuits && dialHz !== null) {
      const { settled } = builtAt(inputs, doc, dialHz, spec.points, tracker.nominal);
      const followed = followResonators(settled, tracker);
      if (followed.every((r) => r.resonanceHz !== null)) {
        figures = { circuits: followed, judged: judgedFigures(settled, lastNode) };
        tracker = movedTracker(tracker, followed);
      }
    }
    if (!figures) {
      // In full: the first position, and any position where a circuit could not be followed.
      if (!(spec.oscillator && mixer)) {
        // The dial reads the first member's circuit: search for it well around the last reading.
        const probe = analyseAt(inputs, doc, guessHz, spec.points, 4);
        const ref = probe.resonators.find((r) => r.stageId === first.stageId);
        if (!ref || ref.resonanceHz === null) {
          throw new StudySetupError(
            `at dial ${dial.toFixed(2)} the tuned circuit of "${first.stageId}" has no resonance in reach: check the gang's range`,
          );
        }
        dialHz = ref.resonanceHz;
      }
      const at = dialHz!;
      const result = analyseAt(inputs, doc, at, spec.points);
      circuits ??= result.resonators.map((r) => ({
        stageId: r.stageId,
        label: r.label,
        ganged: gangStages.has(r.stageId),
      }));
      figures = fromResult(result, circuits);
      tracker = positionTracker(inputs, doc, at, spec.points, lastNode, circuits);
    }
    guessHz = dialHz!;
    const pos = readPosition(figures, circuits!, dial, dialHz!, loHz, spec.mistrackFraction);
    positions.push(pos);
    onPosition?.(k + 1, spec.positions, pos);
  }
  const errors = positions.flatMap((p) =>
    p.trackingErrorHz.filter((e): e is number => e !== null && Number.isFinite(e)),
  );
  return {
    circuits: circuits ?? [],
    positions,
    mistrackedPositions: positions.filter((p) => p.mistracked.some(Boolean)).length,
    worstTrackingErrorHz: errors.length
      ? errors.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a))
      : null,
    mistrackFraction: spec.mistrackFraction,
  };
}

/**
 * The tracker of a position analysed in full: the study's circuits (matched by stage, in
 * order, as fromResult reads them) where the full analysis finds them.
 */
function positionTracker(
  inputs: StudyInputs,
  doc: ChainDocument,
  dialHz: number,
  points: number,
  lastNode: number,
  circuits: BandCircuit[],
): TrialTracker {
  const { chain, settled } = builtAt(inputs, doc, dialHz, points);
  const findings = analyzeResonators(settled, runNodeAnalysis(settled, frequencyGrid(settled.settings.sweep))); // prettier-ignore
  const matched = circuits.map(
    (c, i) => findings.filter((x) => x.stageId === c.stageId)[countBefore(circuits, i)],
  );
  return trialTracker(chain, matched, lastNode);
}

function readPosition(
  figures: PositionFigures,
  circuits: BandCircuit[],
  dial: number,
  dialHz: number,
  loHz: number | null,
  fraction: number,
): BandPosition {
  const { judged } = figures;
  const pos: BandPosition = {
    dial, dialHz, loHz, resonanceHz: [], trackingErrorHz: [], loadedQ: [], bandwidthHz: [], mistracked: [],
    gainDb: judged.gainDb,
    noiseFigureDb: judged.noiseFigureDb,
    imageRejectionDb: judged.imageRejectionDb,
    bandwidth3dbHz: judged.bw3dbHz,
  }; // prettier-ignore
  circuits.forEach((c, i) => {
    const r = figures.circuits[i];
    const fr = fin(r?.resonanceHz);
    const q = fin(r?.loadedQ);
    const bw = fr !== null && q ? fr / q : null;
    const err = fr === null ? null : fr - dialHz;
    pos.resonanceHz.push(fr);
    pos.trackingErrorHz.push(err);
    pos.loadedQ.push(q);
    pos.bandwidthHz.push(bw);
    pos.mistracked.push(
      c.ganged && (err === null || (bw !== null && Math.abs(err) > fraction * bw)),
    );
  });
  return pos;
}

/** How many circuits before index i belong to the same stage (a stage may hold two tanks). */
function countBefore(circuits: BandCircuit[], i: number): number {
  let n = 0;
  for (let j = 0; j < i; j++) if (circuits[j].stageId === circuits[i].stageId) n++;
  return n;
}
