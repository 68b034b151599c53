/**
 * Node, stage and level reports at the design frequency, read from a one-point node
 * analysis at f0 (so f0 figures never depend on the sweep's spacing).
 */
import type { LevelsReport, NodeReport, StageReport, SweepReport } from '../types';
import type { BuiltChain } from './build';
import { cascadeInputPoint } from './linearity';
import { correlationNoiseFigureDb } from './noise-correlation';
import { impedanceRow, type NodeAnalysis } from './nodes';
import {
  emfForAvailableDbm,
  friis,
  noiseTemperature,
  sensitivityDbm,
  sfdrDb,
  stageNoiseFactor,
  thermalNoiseW,
} from './noise';
import {
  availablePower,
  dbm,
  deliveredPower,
  mismatchFactor,
  reflectionMag,
  stepUp,
  vMag,
} from './quantities';
import { lazySweepReport } from './sweep-report';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { PI, SQRT2, atan2, log10, pow } = Math;
const isFiniteNumber = Number.isFinite;

const db10 = (r: number) => 10 * log10(r);
const db20 = (r: number) => 20 * log10(r);
const finiteOrNull = (x: number) => (isFiniteNumber(x) ? x : null);

/**
 * The reference resistance the user chose for user-level node n: the port's own (keyed by
 * the id of the stage the node follows), else the chain's; null when none was chosen.
 */
export function nodeReference(built: BuiltChain, n: number): number | null {
  const { portReferences, referenceOhm } = built.settings;
  const id = n === 0 ? built.source.id : built.twoPorts[n - 1].id;
  return portReferences?.[id] ?? referenceOhm ?? null;
}

/** Return loss (dB) and VSWR of zin against a real reference resistance. */
function againstReference(zr: number, zi: number, ref: number) {
  const g =
    Number.isFinite(zr) && Number.isFinite(zi)
      ? Math.hypot(zr - ref, zi) / Math.hypot(zr + ref, zi)
      : 1;
  return { returnLossDb: 0 - db20(g), vswr: g >= 1 ? Infinity : (1 + g) / (1 - g) };
}

/** Reports of every user-level node at f0. */
export function nodeReports(built: BuiltChain, na: NodeAnalysis): NodeReport[] {
  const pavs = availablePower(na, 0, 0);
  return Array.from(built.userNodeFlat, (flat, n): NodeReport => {
    const k = impedanceRow(na, flat) * na.points;
    const v = vMag(na, flat, 0);
    const ref = nodeReference(built, n);
    const against = ref === null ? null : againstReference(na.zinRe[k], na.zinIm[k], ref);
    const up = stepUp(na, flat, 0);
    const p = deliveredPower(na, flat, 0);
    const pav = availablePower(na, flat, 0);
    const mm = mismatchFactor(na, flat, 0);
    return {
      index: n,
      after: n === 0 ? built.source.label : built.twoPorts[n - 1].label,
      zIn: { re: na.zinRe[k], im: na.zinIm[k] },
      zSrc: { re: na.zsrcRe[k], im: na.zsrcIm[k] },
      vPeak: v,
      vRms: v / SQRT2,
      phaseDeg: (atan2(na.vIm[k], na.vRe[k]) * 180) / PI,
      stepUp: up,
      stepUpDb: db20(up),
      deliveredW: p,
      availableW: pav,
      deliveredDbm: dbm(p),
      availableDbm: dbm(pav),
      transducerGainDb: db10(p / pavs),
      mismatch: mm,
      mismatchLossDb: -db10(mm),
      matchReturnLossDb: 0 - db20(reflectionMag(na, flat, 0)),
      referenceOhm: ref,
      returnLossDb: against ? against.returnLossDb : null,
      vswr: against ? against.vswr : null,
      referenceLevelDbm: ref === null ? null : dbm((v * v) / 2 / ref),
    };
  });
}

/** Per-stage gains, noise and linearity cascades at f0. */
export function stageReports(built: BuiltChain, na: NodeAnalysis): StageReport[] {
  const flats = built.userNodeFlat;
  const pav = Array.from(flats, (j) => availablePower(na, j, 0));
  const v = Array.from(flats, (j) => vMag(na, j, 0));
  const gains = built.twoPorts.map((_, k) => pav[k + 1] / pav[k]);
  const factors = built.twoPorts.map((s, k) => {
    const j = impedanceRow(na, flats[k]) * na.points;
    const zr = na.zsrcRe[j];
    const zi = na.zsrcIm[j];
    const d = zr * zr + zi * zi;
    return stageNoiseFactor(s.model.noise, gains[k], zr / d, -zi / d);
  });
  const cumF = friis(gains, factors);
  const t0 = built.settings.temperatureK;
  const tSource = built.settings.sourceNoiseTemperatureK ?? t0;
  const gainsDb = gains.map(db10);
  const iip3 = cascadeInputPoint(gainsDb, built.twoPorts.map((s) => s.model.linearity?.iip3Dbm ?? null)); // prettier-ignore
  const p1 = cascadeInputPoint(gainsDb, built.twoPorts.map((s) => s.model.linearity?.p1dbDbm ?? null)); // prettier-ignore
  return built.twoPorts.map((s, k): StageReport => ({
    id: s.id,
    type: s.type,
    label: s.label,
    fromNode: k,
    toNode: k + 1,
    fInHz: na.fNode[impedanceRow(na, flats[k]) * na.points],
    fOutHz: na.fNode[impedanceRow(na, flats[k + 1]) * na.points],
    voltageGainDb: db20(v[k + 1] / v[k]),
    cumulativeVoltageGainDb: db20(v[k + 1] / v[0]),
    availableGainDb: gainsDb[k],
    transducerGainDb: db10(deliveredPower(na, flats[k + 1], 0) / pav[k]),
    noiseFigureDb: db10(factors[k]),
    cumulativeNoiseFigureDb: db10(cumF[k]),
    noiseTemperatureK: noiseTemperature(factors[k], t0),
    cumulativeNoiseTemperatureK: noiseTemperature(cumF[k], t0),
    outputNoiseTemperatureK: (pav[k + 1] / pav[0]) * (tSource + noiseTemperature(cumF[k], t0)),
    cumulativeGainDb: db10(pav[k + 1] / pav[0]),
    iip3Dbm: s.model.linearity?.iip3Dbm ?? null,
    cumulativeIip3Dbm: finiteOrNull(iip3[k]),
    p1dbDbm: s.model.linearity?.p1dbDbm ?? null,
    cumulativeP1dbDbm: finiteOrNull(p1[k]),
    inputLevelDbm: dbm(pav[k]),
    ...(s.model.designedValues ? { designedValues: { ...s.model.designedValues } } : {}),
  }));
}

/**
 * Noise figure (dB) of the whole chain at f0 by the Friis cascade of the stage reports; a
 * load that declares its own noise (a converter or receiver input) ends the cascade.
 */
export function chainNoiseFigureDb(
  built: BuiltChain,
  na: NodeAnalysis,
  stages: readonly StageReport[],
): number {
  const last = stages[stages.length - 1];
  const nf = last ? last.cumulativeNoiseFigureDb : 0;
  const loadNoise = built.load.model.noise;
  if (!loadNoise || loadNoise.kind === 'passive') return nf;
  const j = impedanceRow(na, built.sections.length) * na.points;
  const zr = na.zsrcRe[j];
  const zi = na.zsrcIm[j];
  const d = zr * zr + zi * zi;
  const fl = stageNoiseFactor(loadNoise, 1, zr / d, -zi / d);
  const g = last ? pow(10, last.cumulativeGainDb / 10) : 1;
  return db10(pow(10, nf / 10) + (fl - 1) / g);
}

/** Signal and noise levels of the whole chain. */
export function levelsReport(
  built: BuiltChain,
  na: NodeAnalysis,
  stages: StageReport[],
): LevelsReport {
  const { temperatureK, channelBandwidthHz, requiredSnrDb } = built.settings;
  const last = stages[stages.length - 1];
  const nf = chainNoiseFigureDb(built, na, stages);
  // Te = T0·(F − 1) with the chain's reference temperature as T0; the floor is k·Tsys·B,
  // which is kT0·B·F when the source sits at T0.
  const te = noiseTemperature(pow(10, nf / 10), temperatureK);
  const tSource = built.settings.sourceNoiseTemperatureK ?? temperatureK;
  const floor = dbm(thermalNoiseW(tSource + te, channelBandwidthHz));
  const sens = sensitivityDbm(floor, requiredSnrDb);
  const iip3 = last ? last.cumulativeIip3Dbm : null;
  return {
    noiseFloorDbm: floor,
    noiseFigureDb: nf,
    noiseTemperatureK: te,
    sourceNoiseTemperatureK: tSource,
    systemNoiseTemperatureK: tSource + te,
    correlationNoiseFigureDb: correlationNoiseFigureDb(built, na),
    totalGainDb: last ? last.cumulativeGainDb : 0,
    sensitivityDbm: sens,
    sensitivityEmfRms: emfForAvailableDbm(sens, na.zsrcRe[impedanceRow(na, 0) * na.points]) / SQRT2,
    iip3Dbm: iip3,
    sfdrDb: iip3 === null ? null : sfdrDb(iip3, floor),
    inputAvailableDbm: dbm(availablePower(na, 0, 0)),
  };
}

/**
 * The sweep as plain arrays for plotting: step-up and phase per user node, input Zin and RL
 * (against the reference chosen for the chain input, else against the source's own
 * impedance). The traces are computed when first read (sweep-report.ts).
 * @param inputFreqs the frequencies the sweep ran over, when nothing changes or reuses them
 *   (read as they are, not copied)
 * @param inPlace read the workspace in place until its next run (see `lazySweepReport`)
 */
export function sweepReport(
  built: BuiltChain,
  na: NodeAnalysis,
  inputFreqs?: Float64Array,
  inPlace = false,
): SweepReport {
  return lazySweepReport(built, na, nodeReference(built, 0), inputFreqs, inPlace);
}
