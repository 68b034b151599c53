/**
 * The mixer's spurious responses judged through the chain's real selectivity: each
 * response's rejection is the selectivity ahead of the mixer at its frequency (the step-up
 * at the mixer's input relative to the wanted signal's) plus the mixer's own suppression
 * of that (m, n) product.
 */
import type { BuiltChain } from '../core/build';
import { runNodeAnalysis } from '../core/nodes';
import { stepUp } from '../core/quantities';
import type { MixerInfo } from '../core/selectivity';
import { spurFrequencies, suppressionDb, type SpurFrequency } from './spur-frequencies';

export interface SpurOptions {
  maxOrder: number;
  /** Rejection a response must reach, dB. */
  targetDb: number;
  /** Mixer suppression table [n][m], dB. */
  suppressionDb: readonly (readonly number[])[];
  ifBandwidthHz: number;
}

export interface SpurResponse extends SpurFrequency {
  /** Selectivity ahead of the mixer at the response, relative to the wanted signal, dB. */
  selectivityDb: number | null;
  /** The mixer's own suppression of the product, dB. */
  suppressionDb: number;
  /** Selectivity plus suppression, dB (null where the selectivity is unknown). */
  rejectionDb: number | null;
  meetsTarget: boolean | null;
}

const db20 = (r: number) => 20 * Math.log10(r);

/**
 * Selectivity (dB below the response at `refHz`) at the mixer's input for each input
 * frequency, by one node analysis of the chain. The mixer input is ahead of every frequency
 * change, so the input frequency is the chain's own.
 */
export function selectivityAhead(
  built: BuiltChain,
  mixer: MixerInfo,
  refHz: number,
  freqsHz: readonly number[],
): number[] {
  if (freqsHz.length === 0) return [];
  const na = runNodeAnalysis(built, [refHz, ...freqsHz]);
  const ref = stepUp(na, mixer.section, 0);
  return freqsHz.map((_, i) => db20(ref / stepUp(na, mixer.section, i + 1)));
}

/** Every spurious response of the first mixer at the design frequency, lowest rejection first. */
export function spurResponses(
  built: BuiltChain,
  mixer: MixerInfo,
  opts: SpurOptions,
): SpurResponse[] {
  const f0 = built.settings.f0Hz;
  const direct = mixer.fInHz === f0 && mixer.product === 'difference';
  const list = spurFrequencies(mixer.fInHz, mixer.loHz, mixer.ifHz, opts.ifBandwidthHz, opts.maxOrder)
    .filter((s) => s.kind !== 'wanted'); // prettier-ignore
  const withRf = list.filter((s) => s.rfHz !== null);
  const sel = direct
    ? selectivityAhead(
        built,
        mixer,
        f0,
        withRf.map((s) => s.rfHz!),
      )
    : [];
  const selOf = new Map(withRf.map((s, i) => [s, direct ? sel[i] : null]));
  return list
    .map((s): SpurResponse => {
      const sup = suppressionDb(opts.suppressionDb, s.m, s.n);
      // An LO harmonic in the IF passband is there whatever the input: no selectivity helps.
      const selectivityDb = s.rfHz === null ? 0 : (selOf.get(s) ?? null);
      const finite = selectivityDb !== null && Number.isFinite(selectivityDb);
      const rejectionDb = finite ? selectivityDb + sup : null;
      return {
        ...s,
        selectivityDb: finite ? selectivityDb : null,
        suppressionDb: sup,
        rejectionDb,
        meetsTarget: rejectionDb === null ? null : rejectionDb >= opts.targetDb,
      };
    })
    .sort((a, b) => (a.rejectionDb ?? Infinity) - (b.rejectionDb ?? Infinity));
}

export interface SpurChartLine {
  m: number;
  n: number;
  kind: SpurFrequency['kind'];
  /** One entry per dial position: the response's input frequency and its rejection. */
  rfHz: number[];
  rejectionDb: (number | null)[];
}

export interface SpurChart {
  dialHz: number[];
  /** 'above' when the LO sits above the signal. */
  loSide: 'above' | 'below';
  lines: SpurChartLine[];
  /**
   * How the preselector follows the dial: 'gang' — the chain's own variable values turned
   * (its marked gang), each position analysed as tuned; 'constant-q' — assumed to track the
   * dial at the design frequency's Q.
   */
  tuning: 'gang' | 'constant-q';
  /** The assumption behind the rejection figures. */
  note: string;
}

/** One dial position's responses, waiting for their selectivity. */
export interface ChartPosition {
  k: number;
  dialHz: number;
  rfHz: number[];
  slots: { line: SpurChartLine; sup: number }[];
}

/**
 * The spurious-response lines across the dial positions (LO on the mixer's side, IF fixed),
 * with each position's responses listed for the caller to judge through its selectivity.
 */
export function chartLines(
  mixer: MixerInfo,
  opts: SpurOptions,
  dialHz: readonly number[],
  above: boolean,
): { lines: SpurChartLine[]; positions: ChartPosition[] } {
  const n = dialHz.length;
  const byKey = new Map<string, SpurChartLine>();
  const positions: ChartPosition[] = [];
  for (let k = 0; k < n; k++) {
    const f = dialHz[k];
    const lo = above ? f + mixer.ifHz : f - mixer.ifHz;
    if (!(lo > 0)) continue;
    const pos: ChartPosition = { k, dialHz: f, rfHz: [], slots: [] };
    for (const s of spurFrequencies(f, lo, mixer.ifHz, opts.ifBandwidthHz, opts.maxOrder)) {
      if (s.kind === 'wanted' || s.rfHz === null) continue;
      const key = `${s.m}/${s.n}/${Math.sign(s.rfHz - f)}/${s.kind}`;
      let line = byKey.get(key);
      if (!line) {
        line = { m: s.m, n: s.n, kind: s.kind, rfHz: new Array<number>(n).fill(NaN), rejectionDb: new Array<number | null>(n).fill(null) }; // prettier-ignore
        byKey.set(key, line);
      }
      line.rfHz[k] = s.rfHz;
      pos.rfHz.push(s.rfHz);
      pos.slots.push({ line, sup: suppressionDb(opts.suppressionDb, s.m, s.n) });
    }
    positions.push(pos);
  }
  return { lines: [...byKey.values()], positions };
}

/** Writes a position's rejections: selectivity (dB, per response) plus suppression. */
export function judgePosition(pos: ChartPosition, selectivityDb: readonly number[]): void {
  pos.slots.forEach(({ line, sup }, i) => {
    const v = selectivityDb[i];
    line.rejectionDb[pos.k] = v !== undefined && Number.isFinite(v) ? v + sup : null;
  });
}

/**
 * Spurious responses across a tuning range with the LO following the dial
 * (fLO = f ± fIF on the mixer's side), the IF fixed. The chain's preselector is taken to
 * track the dial with a constant Q, so the selectivity at a response is the design
 * frequency's response shape at the same frequency ratio (stated in the chart's note). A
 * chain with a marked gang is charted by spurChartByGang instead.
 */
export function spurChart(
  built: BuiltChain,
  mixer: MixerInfo,
  opts: SpurOptions,
  rangeHz: readonly [number, number],
  positions: number,
): SpurChart {
  const f0 = built.settings.f0Hz;
  const above = mixer.loHz > mixer.fInHz;
  const n = Math.max(2, Math.min(201, Math.round(positions)));
  const dialHz = Array.from({ length: n }, (_, i) => rangeHz[0] + ((rangeHz[1] - rangeHz[0]) * i) / (n - 1)); // prettier-ignore
  const chart = chartLines(mixer, opts, dialHz, above);
  // One node analysis for every response: each scaled to f0 by its position's dial ratio.
  const scaled = chart.positions.flatMap((p) => p.rfHz.map((rf) => (f0 * rf) / p.dialHz));
  const sel = mixer.product === 'difference' ? selectivityAhead(built, mixer, f0, scaled) : [];
  let at = 0;
  for (const p of chart.positions) {
    judgePosition(p, sel.slice(at, at + p.rfHz.length));
    at += p.rfHz.length;
  }
  return {
    dialHz,
    loSide: above ? 'above' : 'below',
    lines: chart.lines,
    tuning: 'constant-q',
    note: 'Preselector taken to track the dial at constant Q: each response is attenuated as the design frequency\'s response is at the same frequency ratio.', // prettier-ignore
  };
}

export interface IfCandidate {
  ifHz: number;
  /** Lowest rejection over the range among the image and responses up to the order, dB. */
  worstRejectionDb: number | null;
  worstKind: SpurFrequency['kind'] | null;
  worstAtDialHz: number | null;
  meetsTarget: boolean;
}

/**
 * Intermediate frequencies commonly used for filters in the trade (ceramic and crystal
 * filter centres), Hz — common practice, a starting list the user can replace.
 */
export const COMMON_IFS_HZ: readonly number[] = [455e3, 1.6e6, 4.433619e6, 9e6, 10.7e6, 21.4e6, 45e6, 70e6]; // prettier-ignore

/** The IF choice weighs the image and the low-order responses only (m + n ≤ 4). */
export const IF_CHOICE_MAX_ORDER = 4;

/**
 * Ranks candidate IFs for a tuning range by the worst rejection of the image and the
 * responses up to order {@link IF_CHOICE_MAX_ORDER} at 11 dial positions, with the chain's preselector tracking the dial
 * (constant Q, as in {@link spurChart}) and the LO on the mixer's side. IFs inside the
 * tuning range are skipped (the IF would pass straight through).
 */
export function rankIfs(
  built: BuiltChain,
  mixer: MixerInfo,
  opts: SpurOptions,
  rangeHz: readonly [number, number],
  candidatesHz: readonly number[] = COMMON_IFS_HZ,
): IfCandidate[] {
  const out: IfCandidate[] = [];
  for (const ifHz of candidatesHz) {
    if (ifHz >= rangeHz[0] && ifHz <= rangeHz[1]) continue;
    const low = { ...opts, maxOrder: Math.min(opts.maxOrder, IF_CHOICE_MAX_ORDER) };
    const chart = spurChart(built, { ...mixer, ifHz, loHz: mixer.loHz > mixer.fInHz ? mixer.fInHz + ifHz : mixer.fInHz - ifHz }, low, rangeHz, 11); // prettier-ignore
    let worst: { db: number; kind: SpurFrequency['kind']; dial: number } | null = null;
    for (const line of chart.lines) {
      line.rejectionDb.forEach((db, k) => {
        if (db !== null && (worst === null || db < worst.db)) worst = { db, kind: line.kind, dial: chart.dialHz[k] }; // prettier-ignore
      });
    }
    const w = worst as { db: number; kind: SpurFrequency['kind']; dial: number } | null;
    out.push({
      ifHz,
      worstRejectionDb: w?.db ?? null,
      worstKind: w?.kind ?? null,
      worstAtDialHz: w?.dial ?? null,
      meetsTarget: w !== null && w.db >= opts.targetDb,
    });
  }
  return out.sort((a, b) => (b.worstRejectionDb ?? -Infinity) - (a.worstRejectionDb ?? -Infinity));
}
