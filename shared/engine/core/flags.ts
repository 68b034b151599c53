/**
 * Flags: what a designer should look at, each with the stage, a severity and one sentence
 * with the numbers behind it. Thresholds come from the chain's settings.
 */
import type { Caution, Flag, ParamSpec } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { formatNumber as num, formatQuantity, hz } from './format';
import type { NodeAnalysis } from './nodes';
import { sourceVswr } from './noise';
import { availablePower, dbm, returnLossDb, vMag } from './quantities';
import { judgedForQ, qBudget } from './q-budget';
import { searchRange, type ResonatorFinding } from './resonators';

/** The usual caution wording for each hazard a stage definition declares. */
export const CAUTION_TEXT: Record<Caution, string> = {
  'high-voltage':
    'works with voltages that can injure or kill: switch off and discharge before touching, and follow local electrical codes and licensed practice.',
  transmit:
    'can radiate: transmitting needs the right licence or authorisation; check the output against local regulations and licensed practice before connecting an antenna.',
  'rf-exposure':
    'can produce RF fields above exposure limits near the antenna: keep people clear and follow the exposure rules and licensed practice where you operate.',
};

export interface FlagInputs {
  built: BuiltChain;
  /** Node analysis at f0 (one point). */
  f0Na: NodeAnalysis;
  resonators: readonly ResonatorFinding[];
}

/** A ratio as shown (two decimals): the loading rule compares what the designer reads. */
const shown = (x: number) => Math.round(x * 100) / 100;

function loadingFlags(built: BuiltChain, r: ResonatorFinding, fr: number, bw: number): Flag[] {
  const t = built.settings.thresholds;
  if (r.loadingRatio === null || r.detachedQ === null) return [];
  const ratio = shown(r.loadingRatio);
  const share = r.downstreamShare === null ? '' : ` The downstream side takes ${num(100 * r.downstreamShare, 2)} % of the damping.`; // prettier-ignore
  const data = {
    resonanceHz: fr,
    detachedQ: r.detachedQ,
    loadedQ: r.loadedQ ?? NaN,
    loadingRatio: r.loadingRatio,
    downstreamShare: r.downstreamShare ?? NaN,
  };
  const change =
    `${r.name} at ${hz(fr)}: Q falls from ${num(r.detachedQ)} to ${num(r.loadedQ ?? NaN)} ` +
    `(ratio ${num(ratio, 2)}) when ${r.downstreamLabel} is attached; bandwidth widens ` +
    `from ${hz(r.detachedBandwidthHz ?? NaN)} to ${hz(bw)}.${share}`;
  const rule = ` Rule: a ratio below ${num(t.loadingWarn, 2)} (as shown, to two decimals) is a warning, below ${num(t.loadingError, 2)} an error; 0.50 is a conjugate match.`; // prettier-ignore
  if (ratio < t.loadingWarn) {
    return [
      {
        code: 'tank-overloaded',
        severity: ratio < t.loadingError ? 'error' : 'warning',
        stageId: r.stageId,
        message: change + rule,
        data,
      },
    ];
  }
  if (ratio === 0.5) {
    return [
      {
        code: 'tank-matched',
        severity: 'info',
        stageId: r.stageId,
        message: `${change} That is a conjugate match (ratio 0.50): the most power reaches ${r.downstreamLabel}, at half the tank's selectivity.${rule}`,
        data,
      },
    ];
  }
  return [];
}

function detuneFlag(
  built: BuiltChain,
  r: ResonatorFinding,
  fr: number,
  bw: number,
  what: string,
): Flag | null {
  // prettier-ignore
  const t = built.settings.thresholds;
  const off = fr - r.f0LocalHz;
  if (!Number.isFinite(bw) || !(Math.abs(off) > t.detuneFraction * bw)) return null;
  return {
    code: 'tank-detuned',
    severity: 'warning',
    stageId: r.stageId,
    message: `${what} at ${hz(fr)}, ${hz(Math.abs(off))} ${off > 0 ? 'above' : 'below'} the design frequency ${hz(r.f0LocalHz)}: ${num(Math.abs(off) / bw, 2)} bandwidths away (its bandwidth is ${hz(bw)}; limit ${num(t.detuneFraction, 2)} bandwidths).`,
    data: { resonanceHz: fr, f0Hz: r.f0LocalHz, offsetHz: off, bandwidthHz: bw },
  };
}

function tankFlags(built: BuiltChain, r: ResonatorFinding): Flag[] {
  const flags: Flag[] = [];
  if (r.resonanceHz !== null && r.loadedQ === null) return flags; // lossless: Q is unbounded
  if (r.resonanceHz === null || r.loadedQ === null) {
    const [lo, hi] = searchRange(built);
    flags.push({
      code: 'no-resonance',
      severity: 'warning',
      stageId: r.stageId,
      message: `${r.name} shows no resonance between ${hz(lo)} and ${hz(hi)} near the design frequency ${hz(r.f0LocalHz)}; check its L and C values.`,
      data: { f0Hz: r.f0LocalHz },
    });
    return flags;
  }
  const fr = r.resonanceHz;
  const bw = r.bandwidthHz ?? NaN;
  flags.push(...loadingFlags(built, r, fr, bw));
  // A found resonance far from f0 is another mode of the chain, not a mistuned tank.
  if (r.origin !== 'found') {
    const d = detuneFlag(built, r, fr, bw, `${r.name} resonates`);
    if (d) flags.push(d);
  }
  return flags;
}

/** A coupled pair judged where it really peaks (once per pair). */
function pairFlags(built: BuiltChain, resonators: readonly ResonatorFinding[]): Flag[] {
  const flags: Flag[] = [];
  const seen = new Set<string>();
  for (const r of resonators) {
    if (r.pairPeakHz == null || r.pairBandwidthHz == null || seen.has(r.stageId)) continue;
    seen.add(r.stageId);
    const label = built.twoPorts.find((s) => s.id === r.stageId)?.label ?? r.stageId;
    const d = detuneFlag(built, r, r.pairPeakHz, r.pairBandwidthHz, `Coupled pair "${label}" peaks`); // prettier-ignore
    if (d) {
      d.message += ' Its tanks alone resonate near the design frequency; what loads or couples them pulls the pair.'; // prettier-ignore
      d.data = { ...d.data, pairPeakHz: r.pairPeakHz };
      flags.push(d);
    }
  }
  return flags;
}

/** The q-budget flag of a matching network or filter, and the design-Q check. */
function qBudgetFlag(built: BuiltChain, f0Na: NodeAnalysis, stage: BuiltStage): Flag | null {
  const m = stage.model;
  const name = `"${stage.label}"`;
  const limit = built.settings.thresholds.qBudgetLossDb;
  const design = m.qBudget;
  const designShort = !!design && design.required > design.componentQ;
  const designText = designShort ? ` It needs a loaded Q of ${num(design.required)} but its parts have Q ${num(design.componentQ)}.` : ''; // prettier-ignore
  const qb = judgedForQ(stage) ? qBudget(built, f0Na, stage, limit) : null;
  if (qb && qb.lossDb > limit) {
    const fix = qb.neededQ === null ? 'no part Q brings it under; change the design.' : `parts of Q ${num(qb.neededQ)} or better (now ${num(qb.partQ)}) would bring it under.`; // prettier-ignore
    return {
      code: 'q-budget',
      severity: 'warning',
      stageId: stage.id,
      message: `${name} loses ${num(qb.lossDb)} dB at ${hz(built.f0AtFlatNode[stage.firstSection])} in its parts' finite Q, more than the chain's ${num(limit)} dB limit; ${fix}${designText}`,
      data: { lossDb: qb.lossDb, limitDb: limit, partQ: qb.partQ, neededQ: qb.neededQ ?? NaN },
    };
  }
  if (designShort) {
    return {
      code: 'q-budget',
      severity: 'warning',
      stageId: stage.id,
      message: `${name} needs a loaded Q of ${num(design.required)} but its parts have Q ${num(design.componentQ)}; losses will eat the match. Use a lower-Q design or better parts.`,
      data: { requiredQ: design.required, componentQ: design.componentQ },
    };
  }
  return null;
}

/**
 * A stated noise figure driven from a source other than the one it was stated at: the
 * figure no longer holds (the real one depends on noise parameters the stage does not give).
 */
function noiseMismatchFlag(built: BuiltChain, f0Na: NodeAnalysis, stage: BuiltStage): Flag | null {
  const decl = stage.model.noise;
  if (!decl || decl.kind !== 'figure' || decl.ratedSourceOhm === undefined) return null;
  const limit = built.settings.thresholds.noiseMismatchVswr;
  const k = stage.firstSection * f0Na.points;
  const zr = f0Na.zsrcRe[k];
  const zi = f0Na.zsrcIm[k];
  const rx = decl.ratedSourceX ?? 0;
  const ratio = sourceVswr(decl.ratedSourceOhm, zr, zi, rx);
  if (!(ratio > limit)) return null;
  const seen = Number.isFinite(zr) ? formatImpedance(zr, zi) : 'an open circuit';
  return {
    code: 'noise-mismatch',
    severity: 'warning',
    stageId: stage.id,
    message:
      `"${stage.label}" has its ${num(decl.nfDb)} dB noise figure stated for a ` +
      `${formatImpedance(decl.ratedSourceOhm, rx)} source but is driven from ${seen} ` +
      `(VSWR ${Number.isFinite(ratio) ? num(ratio) : '∞'} : 1, limit ${num(limit)} : 1); its real noise figure ` +
      'can be far higher. Give its noise parameters (Fmin, Rn, optimum source) to have it computed, or match the source to it.',
    data: {
      nfDb: decl.nfDb,
      ratedSourceOhm: decl.ratedSourceOhm,
      ratedSourceX: rx,
      sourceRe: zr,
      sourceIm: zi,
      vswr: Number.isFinite(ratio) ? ratio : 'infinite',
      limitVswr: limit,
    },
  };
}

/**
 * Values inside the hard range but outside the typical one: analysed, but most likely a
 * typing slip (a unit prefix), so the designer is asked to look.
 */
function outsideTypical(spec: ParamSpec, v: number): boolean {
  const t = spec.typical;
  return !!t && ((t.min !== undefined && v < t.min) || (t.max !== undefined && v > t.max));
}

function implausibleValueFlags(stage: BuiltStage): Flag[] {
  const flags: Flag[] = [];
  for (const spec of stage.definition.params) {
    const v = stage.values[spec.key];
    if (spec.kind !== 'number' || typeof v !== 'number' || !outsideTypical(spec, v)) continue;
    if (spec.showWhen && stage.values[spec.showWhen.key] !== spec.showWhen.equals) continue;
    const t = spec.typical!;
    const range =
      t.min !== undefined && t.max !== undefined
        ? `${formatQuantity(t.min, spec.unit)} to ${formatQuantity(t.max, spec.unit)}`
        : t.min !== undefined
          ? `from ${formatQuantity(t.min, spec.unit)} up`
          : `up to ${formatQuantity(t.max!, spec.unit)}`;
    flags.push({
      code: 'implausible-value',
      severity: 'warning',
      stageId: stage.id,
      message: `"${stage.label}": ${spec.label} is ${formatQuantity(v, spec.unit)}, outside the typical range (${range}); check the value and its unit prefix.`,
      data: {
        param: spec.key,
        value: v,
        ...(t.min !== undefined ? { typicalMin: t.min } : {}),
        ...(t.max !== undefined ? { typicalMax: t.max } : {}),
      },
    });
  }
  return flags;
}

function formatImpedance(re: number, im: number): string {
  if (Math.abs(im) < 1e-3 * Math.abs(re)) return formatQuantity(re, 'ohm');
  return `${formatQuantity(re, 'ohm')} ${im < 0 ? '−' : '+'} j${formatQuantity(Math.abs(im), 'ohm')}`;
}

/** Every flag of the chain, in chain order within each kind. */
export function raiseFlags({ built, f0Na, resonators }: FlagInputs): Flag[] {
  const t = built.settings.thresholds;
  const flags: Flag[] = [];
  for (const r of resonators) flags.push(...tankFlags(built, r));
  flags.push(...pairFlags(built, resonators));
  // Loads take part too: a detector or converter input is often the chain's last stage.
  for (const stage of [...built.twoPorts, built.load]) {
    const m = stage.model;
    const name = `"${stage.label}"`;
    const noise = noiseMismatchFlag(built, f0Na, stage);
    if (noise) flags.push(noise);
    if (m.designedMatch) {
      const rl = returnLossDb(f0Na, stage.firstSection, 0);
      if (rl < t.matchReturnLossDb) {
        flags.push({
          code: 'match-missed',
          severity: 'warning',
          stageId: stage.id,
          message: `${name} was designed to match ${formatQuantity(m.designedMatch.r1, 'ohm')} to ${formatQuantity(m.designedMatch.r2, 'ohm')}, but its input return loss at ${hz(built.settings.f0Hz)} is ${num(rl)} dB (wanted at least ${num(t.matchReturnLossDb)} dB); check what it really sees on each side.`,
          data: { returnLossDb: rl, thresholdDb: t.matchReturnLossDb },
        });
      }
    }
    const p1 = m.linearity?.p1dbDbm;
    const level = dbm(availablePower(f0Na, stage.firstSection, 0));
    if (p1 !== undefined && level > p1 - t.compressionBackoffDb) {
      flags.push({
        code: 'compression',
        severity: level > p1 ? 'error' : 'warning',
        stageId: stage.id,
        message: `${name} is driven at ${num(level)} dBm available, ${level > p1 ? `${num(level - p1)} dB past` : `within ${num(p1 - level)} dB of`} its ${num(p1)} dBm 1 dB compression point (back-off wanted: ${num(t.compressionBackoffDb)} dB).`,
        data: { inputLevelDbm: level, p1dbDbm: p1 },
      });
    }
    if (m.detector) {
      const v = vMag(f0Na, stage.firstSection, 0);
      if (v < m.detector.minInputPeakV) {
        flags.push({
          code: 'detector-underdriven',
          severity: 'warning',
          stageId: stage.id,
          message: `${name} gets ${formatQuantity(v, 'volt')} peak (${formatQuantity(v / Math.SQRT2, 'volt')} rms) at ${hz(built.f0AtFlatNode[stage.firstSection])}, below the ${formatQuantity(m.detector.minInputPeakV, 'volt')} peak it needs to work properly; add gain or step the voltage up before it.`,
          data: { inputPeakV: v, minInputPeakV: m.detector.minInputPeakV },
        });
      }
    }
    const qFlag = qBudgetFlag(built, f0Na, stage);
    if (qFlag) flags.push(qFlag);
  }
  for (const stage of [built.source, ...built.twoPorts, built.load]) {
    flags.push(...implausibleValueFlags(stage));
  }
  for (const stage of [built.source, ...built.twoPorts, built.load]) {
    for (const c of stage.definition.cautions ?? []) {
      flags.push({
        code: 'caution',
        severity: 'info',
        stageId: stage.id,
        message: `Caution: "${stage.label}" ${CAUTION_TEXT[c]}`,
        data: { caution: c },
      });
    }
  }
  return flags;
}
