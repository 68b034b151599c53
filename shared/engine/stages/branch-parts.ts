/**
 * The parts of a branch to ground, written as a short list in the stage's own words:
 * `series L 27n; shunt C 4.7p; shunt R 50 rx; series line 50 0.1 0.66; shunt switch`.
 * Each part is `series` (along the branch) or `shunt` (from the branch to ground), then R,
 * L, C, `switch` (the stage's switch contact) or `line` (series only: Z0, length in metres,
 * velocity factor; lossless). Values take SI prefixes (f p n u µ m k M G). `rx` after a part
 * marks it as the receiver's input. After the last part the branch ends at ground or open.
 *
 * The branch is evaluated as a cascade of ABCD matrices applied to the (V, I) at its far end
 * (ground: (0, 1); open: (1, 0)): its input impedance is V/I at the tap, and the same
 * vectors give every node's voltage and current for the stress of each part.
 */
import { StageParameterError } from '../errors';
import { capacitorY, capacitorZ, inductorY, inductorZ } from './primitives';

const SPEED_OF_LIGHT = 299_792_458;
const PREFIX: Record<string, number> = { f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, µ: 1e-6, m: 1e-3, k: 1e3, M: 1e6, G: 1e9 }; // prettier-ignore

export type BranchPartKind = 'R' | 'L' | 'C' | 'switch' | 'line';

/** One part of a branch. */
export interface BranchPart {
  place: 'series' | 'shunt';
  kind: BranchPartKind;
  /** R in ohm, L in henry, C in farad; a line's Z0 in ohm. */
  value: number;
  /** A line's length (m) and velocity factor. */
  length?: number;
  vf?: number;
  receiverInput: boolean;
  /** As the user wrote it, for messages and reports. */
  text: string;
}

/** What the branch's parts need from the stage: part Q and the switch contact. */
export interface BranchContext {
  ql: number;
  qc: number;
  switchClosed: boolean;
  ron: number;
  coff: number;
}

function parseValue(token: string | undefined, what: string, where: string): number {
  const m = /^([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)([fpnuµmkMG]?)(?:ohm|Ω|H|F|m)?$/.exec(token ?? ''); // prettier-ignore
  const v = m ? Number(m[1]) * (m[2] ? PREFIX[m[2]] : 1) : NaN;
  if (!(v > 0) || !Number.isFinite(v))
    throw new StageParameterError('parts', `${where}: the ${what} must be a positive number such as 4.7p or 1k (got "${token ?? ''}")`); // prettier-ignore
  return v;
}

/** Parses the parts list; throws a StageParameterError naming the part at fault. */
export function parseBranch(text: string): BranchPart[] {
  const items = text
    .split(/[;\n]/)
    .map((s) => s.trim())
    .filter(Boolean);
  if (items.length === 0)
    throw new StageParameterError('parts', 'the branch needs at least one part, e.g. "shunt C 2.2p; series L 56n"'); // prettier-ignore
  return items.map((item, i) => {
    const where = `part ${i + 1} ("${item}")`;
    const tokens = item.split(/\s+/);
    const rx = tokens[tokens.length - 1].toLowerCase() === 'rx';
    if (rx) tokens.pop();
    const [placeRaw, kindRaw, ...rest] = tokens;
    const place = placeRaw?.toLowerCase();
    if (place !== 'series' && place !== 'shunt')
      throw new StageParameterError('parts', `${where}: start with "series" (along the branch) or "shunt" (to ground)`); // prettier-ignore
    const k = (kindRaw ?? '').toLowerCase();
    const kind: BranchPartKind | undefined =
      k === 'r' ? 'R' : k === 'l' ? 'L' : k === 'c' ? 'C' : k === 'switch' ? 'switch' : k === 'line' ? 'line' : undefined; // prettier-ignore
    if (!kind)
      throw new StageParameterError('parts', `${where}: the part must be R, L, C, switch or line`); // prettier-ignore
    const base = { place, kind, receiverInput: rx, text: item } as const;
    if (kind === 'switch') {
      if (rest.length > 0) throw new StageParameterError('parts', `${where}: a switch takes no value here; set its on-resistance and off-capacitance on the stage`); // prettier-ignore
      return { ...base, value: 0 };
    }
    if (kind === 'line') {
      if (place !== 'series')
        throw new StageParameterError('parts', `${where}: a line runs along the branch; write "series line Z0 length vf" and end the branch open or at ground for a stub`); // prettier-ignore
      const vf = parseValue(rest[2], 'velocity factor', where);
      if (vf > 1) throw new StageParameterError('parts', `${where}: the velocity factor must be at most 1`); // prettier-ignore
      return { ...base, value: parseValue(rest[0], 'impedance', where), length: parseValue(rest[1], 'length', where), vf }; // prettier-ignore
    }
    if (rest.length !== 1)
      throw new StageParameterError('parts', `${where}: give one value, e.g. "${place} ${kind} ${kind === 'R' ? '50' : kind === 'L' ? '27n' : '4.7p'}"`); // prettier-ignore
    return { ...base, value: parseValue(rest[0], kind === 'R' ? 'resistance' : kind === 'L' ? 'inductance' : 'capacitance', where) }; // prettier-ignore
  });
}

/**
 * Writes a part's ABCD (complex, 8 slots) at f into m. Series: [[1, Z], [0, 1]]; shunt:
 * [[1, 0], [Y, 1]]; lossless line: [[cos βl, jZ0 sin βl], [j sin βl / Z0, cos βl]].
 */
function partAbcd(
  p: BranchPart,
  ctx: BranchContext,
  f: number,
  m: Float64Array,
  t: Float64Array,
): void {
  m.fill(0);
  m[0] = 1;
  m[6] = 1;
  if (p.kind === 'line') {
    const bl = (2 * Math.PI * f * (p.length as number)) / ((p.vf as number) * SPEED_OF_LIGHT);
    const c = Math.cos(bl);
    const s = Math.sin(bl);
    m[0] = c;
    m[6] = c;
    m[3] = p.value * s;
    m[5] = s / p.value;
    return;
  }
  const series = p.place === 'series';
  if (p.kind === 'R' || (p.kind === 'switch' && ctx.switchClosed)) {
    const r = p.kind === 'R' ? p.value : ctx.ron;
    t[0] = series ? r : 1 / r;
    t[1] = 0;
  } else if (p.kind === 'L') {
    if (series) inductorZ(f, p.value, ctx.ql, t, 0);
    else inductorY(f, p.value, ctx.ql, t, 0);
  } else {
    const c = p.kind === 'C' ? p.value : ctx.coff;
    const q = p.kind === 'C' ? ctx.qc : 1e12;
    if (series) capacitorZ(f, c, q, t, 0);
    else capacitorY(f, c, q, t, 0);
  }
  if (series) {
    m[2] = t[0];
    m[3] = t[1];
  } else {
    m[4] = t[0];
    m[5] = t[1];
  }
}

/**
 * (V, I) at every node of the branch for unit current (ground end) or unit voltage (open
 * end) at its far end: node 0 is the tap, node k the node after part k−1. Re/im interleaved.
 */
export function branchVectors(
  parts: readonly BranchPart[],
  ctx: BranchContext,
  end: 'ground' | 'open',
  f: number,
  out: Float64Array = new Float64Array(4 * (parts.length + 1)),
  m: Float64Array = new Float64Array(8),
  t: Float64Array = new Float64Array(2),
): Float64Array {
  let o = 4 * parts.length;
  out[o] = end === 'open' ? 1 : 0;
  out[o + 1] = 0;
  out[o + 2] = end === 'open' ? 0 : 1;
  out[o + 3] = 0;
  for (let k = parts.length - 1; k >= 0; k--) {
    partAbcd(parts[k], ctx, f, m, t);
    const vr = out[o];
    const vi = out[o + 1];
    const ir = out[o + 2];
    const ii = out[o + 3];
    o -= 4;
    out[o] = m[0] * vr - m[1] * vi + m[2] * ir - m[3] * ii;
    out[o + 1] = m[0] * vi + m[1] * vr + m[2] * ii + m[3] * ir;
    out[o + 2] = m[4] * vr - m[5] * vi + m[6] * ir - m[7] * ii;
    out[o + 3] = m[4] * vi + m[5] * vr + m[6] * ii + m[7] * ir;
  }
  return out;
}

/** Labels the part as a report names it: "part 2 (shunt C 4.7p)". */
export function partLabel(p: BranchPart, i: number): string {
  return `part ${i + 1} (${p.text})`;
}
