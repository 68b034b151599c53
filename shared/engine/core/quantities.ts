/**
 * Quantities derived from a node analysis at one node and point: admittance, delivered and
 * available power, mismatch, reflection. All voltages are PEAK, so powers carry the ½.
 */
import { impedanceRow, voltageRow, type NodeAnalysis } from './nodes';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { abs, hypot, log10 } = Math;
const isFiniteNumber = Number.isFinite;

const open = (re: number, im: number) => !isFiniteNumber(re) || !isFiniteNumber(im);

/** Index of (flat node, point) in a node analysis's frequencies and impedances. */
export function at(na: NodeAnalysis, node: number, i: number): number {
  return impedanceRow(na, node) * na.points + i;
}

/** |V| at a node, PEAK volts. */
export function vMag(na: NodeAnalysis, node: number, i: number): number {
  const k = voltageRow(na, node) * na.points + i;
  return hypot(na.vRe[k], na.vIm[k]);
}

/** |V[node]| / |Es|: the voltage step-up relative to the source EMF. */
export function stepUp(na: NodeAnalysis, node: number, i: number): number {
  return vMag(na, node, i) / abs(na.emf[i]);
}

/** Re(1/Zin) at a node (0 when open), siemens. */
export function gIn(na: NodeAnalysis, node: number, i: number): number {
  const k = impedanceRow(na, node) * na.points + i;
  const r = na.zinRe[k];
  const x = na.zinIm[k];
  if (open(r, x)) return 0;
  return r / (r * r + x * x);
}

/** Power delivered into the node toward the load, W: |V|²·Re(1/Zin)/2. */
export function deliveredPower(na: NodeAnalysis, node: number, i: number): number {
  const v = vMag(na, node, i);
  return (v * v * gIn(na, node, i)) / 2;
}

/**
 * Available power at a node, W: |Vth|²/(8·Re Zsrc) with Vth = V·(Zsrc + Zin)/Zin.
 * NaN when the source side has no resistance (no power is defined as available).
 */
export function availablePower(na: NodeAnalysis, node: number, i: number): number {
  const k = impedanceRow(na, node) * na.points + i;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  const kv = voltageRow(na, node) * na.points + i;
  const vr = na.vRe[kv];
  const vi = na.vIm[kv];
  if (open(sr, si) || !(sr > 0)) return NaN;
  let tr = vr;
  let ti = vi;
  if (!open(zr, zi)) {
    const z2 = zr * zr + zi * zi;
    if (z2 === 0) return NaN; // shorted node: the Thevenin voltage is not visible here
    // (Zsrc + Zin)/Zin = 1 + Zsrc/Zin
    const qr = 1 + (sr * zr + si * zi) / z2;
    const qi = (si * zr - sr * zi) / z2;
    tr = vr * qr - vi * qi;
    ti = vr * qi + vi * qr;
  }
  return (tr * tr + ti * ti) / (8 * sr);
}

/** Mismatch factor 4·Re Zsrc·Re Zin / |Zsrc + Zin|² at a node (0 for an open node). */
export function mismatchFactor(na: NodeAnalysis, node: number, i: number): number {
  const k = impedanceRow(na, node) * na.points + i;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  if (open(zr, zi) || open(sr, si)) return 0;
  const dr = sr + zr;
  const di = si + zi;
  return (4 * sr * zr) / (dr * dr + di * di);
}

/** |Γ| of Zin against Zsrc* at a node: |Zin − Zsrc*| / |Zin + Zsrc| (1 when open). */
export function reflectionMag(na: NodeAnalysis, node: number, i: number): number {
  const k = impedanceRow(na, node) * na.points + i;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  if (open(zr, zi) || open(sr, si)) return 1;
  return hypot(zr - sr, zi + si) / hypot(zr + sr, zi + si);
}

/** Return loss in dB from {@link reflectionMag} (Infinity for a perfect match). */
export function returnLossDb(na: NodeAnalysis, node: number, i: number): number {
  return 0 - 20 * log10(reflectionMag(na, node, i)); // 0 − 0 keeps a total reflection at +0 dB
}

/** VSWR from {@link reflectionMag} (Infinity for total reflection). */
export function vswr(na: NodeAnalysis, node: number, i: number): number {
  const g = reflectionMag(na, node, i);
  return g >= 1 ? Infinity : (1 + g) / (1 - g);
}

/** Power in watts as dBm. */
export function dbm(watts: number): number {
  return 10 * log10(watts / 1e-3);
}
