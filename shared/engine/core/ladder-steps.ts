/**
 * The node analysis's steps across the two sections a ladder is made of, each in loops of its
 * own: one admittance across the line (Section.ladder 'shunt', ABCD [[1, 0], [Y, 1]]) and one
 * impedance in it ('series', [[1, Z], [0, 1]]). Each is node-steps.ts's general step with the
 * ones and zeros of its matrix written in: the same operations in the same order, so the same
 * numbers to the bit, without reading six of the eight slots; and across a shunt the voltage
 * is copied (see node-steps.ts's `voltageSection`). Measured in an in-process alternation on
 * the bench chain (12 shunt and 6 series sections of 23): the shunt's forward step about 3 % of
 * a whole analysis, its backward step 1 %, the series' two 1.4 %, and filling both by their one
 * part alone (Section.partFill) 3-4 %.
 *
 * They are written out, beside the general loops they repeat, on purpose: a loop made from the
 * general one with the constants passed in would read them (V8 compiles one code for a
 * function, whatever its arguments), and a shared per-point helper for the common tail costs
 * a call per point in a cold run (the CLI's one analysis), as node-steps.ts says of its own.
 */

const OPEN = Number.POSITIVE_INFINITY;

/**
 * node-steps.ts's `backSection` through a shunt section (Section.ladder 'shunt'), between any places:
 * Zin at its input into outRe/outIm from `outAt` from Zin at its output (inRe/inIm from
 * `inAt`). The same expressions with its A = D = 1, B = 0 written in, so the same numbers,
 * reading only C from the matrix.
 */
export function backShuntSection(
  m: Float64Array,
  mj: number,
  inRe: Float64Array,
  inIm: Float64Array,
  inAt: number,
  outRe: Float64Array,
  outIm: Float64Array,
  outAt: number,
  n: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const zr = inRe[inAt + k];
    const zi = inIm[inAt + k];
    const c0 = m[o + 4];
    const c1 = m[o + 5];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (zr - zr === 0 && zi - zi === 0) {
      // Term by term as backSection rounds them (see forwardShuntSection).
      nr = 1 * zr - 0 * zi + 0;
      ni = 1 * zi + 0 * zr + 0;
      dr = c0 * zr - c1 * zi + 1;
      di = c0 * zi + c1 * zr + 0;
    } else {
      nr = 1;
      ni = 0;
      dr = c0;
      di = c1;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      outRe[outAt + k] = OPEN;
      outIm[outAt + k] = 0;
    } else {
      const inv = 1 / d2;
      outRe[outAt + k] = (nr * dr + ni * di) * inv;
      outIm[outAt + k] = (ni * dr - nr * di) * inv;
    }
  }
}

/**
 * Zsrc and V at the output of a shunt section (Section.ladder 'shunt') for a block of points, the
 * fused forward step of the node analyses (node-block.ts, node-block-kept.ts) with the places
 * of their own: Zsrc at its input read from sInRe/sInIm at `sIn` and at its output written to
 * sOutRe/sOutIm at `sOut`, Zin at its output read from zRe/zIm at `zAt`, the voltages read from
 * vInRe/vInIm at `vIn` and written to vOutRe/vOutIm at `vOut` (the places read and written may
 * be the same). Zsrc is node-steps.ts's `forwardStep` expressions with the shunt's A = D = 1, B = 0
 * written in, so the same numbers, without reading them; the voltage is
 * {@link shuntVoltageSection}'s copy for a shunt. Only C is read from the matrix.
 */
export function forwardShuntSection(
  m: Float64Array,
  mj: number,
  sInRe: Float64Array,
  sInIm: Float64Array,
  sIn: number,
  sOutRe: Float64Array,
  sOutIm: Float64Array,
  sOut: number,
  zRe: Float64Array,
  zIm: Float64Array,
  zAt: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    // Every value read before the first store (the places may be one).
    const c0 = m[o + 4];
    const c1 = m[o + 5];
    const sr = sInRe[sIn + k];
    const si = sInIm[sIn + k];
    const ar = zRe[zAt + k];
    const ai = zIm[zAt + k];
    const vr = vInRe[vIn + k];
    const vi = vInIm[vIn + k];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (sr - sr === 0 && si - si === 0) {
      // (D·Z + B)/(C·Z + A) term by term as forwardStep rounds it: the products by 0 and the
      // added zeros stay, since they settle the sign of a zero result.
      nr = 1 * sr - 0 * si + 0;
      ni = 1 * si + 0 * sr + 0;
      dr = c0 * sr - c1 * si + 1;
      di = c0 * si + c1 * sr + 0;
    } else {
      nr = 1;
      ni = 0;
      dr = c0;
      di = c1;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      sOutRe[sOut + k] = OPEN;
      sOutIm[sOut + k] = 0;
    } else {
      const inv = 1 / d2;
      sOutRe[sOut + k] = (nr * dr + ni * di) * inv;
      sOutIm[sOut + k] = (ni * dr - nr * di) * inv;
    }
    if ((ar - ar === 0 && ai - ai === 0 && ar * ar + ai * ai === 0) || (vr === 0 && vi === 0)) {
      vOutRe[vOut + k] = 0;
      vOutIm[vOut + k] = 0;
    } else {
      vOutRe[vOut + k] = vr;
      vOutIm[vOut + k] = vi;
    }
  }
}

/** node-steps.ts's `voltageSection` through a shunt section: V at the output is V at the input. */
export function shuntVoltageSection(
  zRe: Float64Array,
  zIm: Float64Array,
  zAt: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
): void {
  for (let k = 0; k < n; k++) {
    const ar = zRe[zAt + k];
    const ai = zIm[zAt + k];
    const vr = vInRe[vIn + k];
    const vi = vInIm[vIn + k];
    const shorted = ar - ar === 0 && ai - ai === 0 && ar * ar + ai * ai === 0;
    if (shorted || (vr === 0 && vi === 0)) {
      vOutRe[vOut + k] = 0;
      vOutIm[vOut + k] = 0;
    } else {
      vOutRe[vOut + k] = vr;
      vOutIm[vOut + k] = vi;
    }
  }
}

/**
 * {@link backShuntSection}'s counterpart through a series section (Section.ladder 'series'),
 * between any places: Zin at the input is Zin at the output plus Z, by backSection's
 * expressions with A = D = 1, C = 0 written in, reading B (= Z) alone.
 */
export function backSeriesSection(
  m: Float64Array,
  mj: number,
  inRe: Float64Array,
  inIm: Float64Array,
  inAt: number,
  outRe: Float64Array,
  outIm: Float64Array,
  outAt: number,
  n: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const zr = inRe[inAt + k];
    const zi = inIm[inAt + k];
    const b0 = m[o + 2];
    const b1 = m[o + 3];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (zr - zr === 0 && zi - zi === 0) {
      nr = 1 * zr - 0 * zi + b0;
      ni = 1 * zi + 0 * zr + b1;
      dr = 0 * zr - 0 * zi + 1;
      di = 0 * zi + 0 * zr + 0;
    } else {
      nr = 1;
      ni = 0;
      dr = 0;
      di = 0;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      outRe[outAt + k] = OPEN;
      outIm[outAt + k] = 0;
    } else {
      const inv = 1 / d2;
      outRe[outAt + k] = (nr * dr + ni * di) * inv;
      outIm[outAt + k] = (ni * dr - nr * di) * inv;
    }
  }
}

/**
 * Zsrc and V at the output of a series section (Section.ladder 'series') for a block of points, with
 * the places of node-block.ts's fused forward step (`na`'s rows from `at`, the voltages from
 * `vIn` to `vOut`): its expressions with A = D = 1, C = 0 written in, B (= Z) read.
 */
export function forwardSeriesSection(
  m: Float64Array,
  mj: number,
  zsrcRe: Float64Array,
  zsrcIm: Float64Array,
  zinRe: Float64Array,
  zinIm: Float64Array,
  at: number,
  P: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const from = at + k;
    const to = from + P;
    // Every value read before the first store (see node-block.ts's forwardSection).
    const b0 = m[o + 2];
    const b1 = m[o + 3];
    const sr = zsrcRe[from];
    const si = zsrcIm[from];
    const ar = zinRe[to];
    const ai = zinIm[to];
    const vr = vInRe[vIn + k];
    const vi = vInIm[vIn + k];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (sr - sr === 0 && si - si === 0) {
      nr = 1 * sr - 0 * si + b0;
      ni = 1 * si + 0 * sr + b1;
      dr = 0 * sr - 0 * si + 1;
      di = 0 * si + 0 * sr + 0;
    } else {
      nr = 1;
      ni = 0;
      dr = 0;
      di = 0;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      zsrcRe[to] = OPEN;
      zsrcIm[to] = 0;
    } else {
      const inv = 1 / d2;
      zsrcRe[to] = (nr * dr + ni * di) * inv;
      zsrcIm[to] = (ni * dr - nr * di) * inv;
    }
    // V/(A + B·Y), Y = 1/Zin(out), with A = 1.
    let er = 1;
    let ei = 0;
    if (ar - ar === 0 && ai - ai === 0) {
      const a2 = ar * ar + ai * ai;
      if (a2 === 0 || (vr === 0 && vi === 0)) {
        vOutRe[vOut + k] = 0;
        vOutIm[vOut + k] = 0;
        continue;
      }
      const ia = 1 / a2;
      const yr = ar * ia;
      const yi = -ai * ia;
      er += b0 * yr - b1 * yi;
      ei += b0 * yi + b1 * yr;
    }
    const ie = 1 / (er * er + ei * ei);
    vOutRe[vOut + k] = (vr * er + vi * ei) * ie;
    vOutIm[vOut + k] = (vi * er - vr * ei) * ie;
  }
}
