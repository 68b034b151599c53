/**
 * A branch to ground: a small one-port network hung across the path (the idle transmitter's
 * output network, a trap, a stub, the receiver's input shorted behind a resonant network).
 * One shunt section of the branch's input admittance. It is judged as what it is meant to
 * be — a block (high impedance at f0) or a short (low impedance at f0) — and never as a tank.
 */
import { StageParameterError } from '../errors';
import type { ComplexFn, PartStress, StageDefinition } from '../types';
import { branchVectors, parseBranch, partLabel, type BranchContext, type BranchPart } from './branch-parts'; // prettier-ignore
import { enumParam, numParam, qParam, readParams, shuntSection, SpiceWriter } from './common';

const BRANCH_PARAMS = [
  {
    key: 'parts',
    label: 'Parts, from the path to ground',
    kind: 'text' as const,
    unit: 'none' as const,
    // A parallel tank to ground (C across, L from the node to ground): a block near 455 MHz.
    default: 'shunt C 2.2p; series L 56n',
    help: 'series/shunt then R, L, C, switch or line, e.g. "series L 27n; shunt C 4.7p; shunt R 50 rx; shunt switch". "rx" marks the receiver\'s input.',
  },
  enumParam('end', 'After the last part', [
    ['ground', 'To ground'],
    ['open', 'Open'],
  ]),
  enumParam('intent', 'Meant to', [
    ['block', 'Block: a high impedance at f0'],
    ['short', 'Short: a low impedance at f0'],
    ['none', 'Neither (not judged)'],
  ]),
  numParam('ratio', 'By a factor of at least', 'ratio', 10, {
    min: 1,
    max: 1e6,
    help: 'Against the impedance the branch shunts (the path onward at its node).',
  }),
  qParam('ql', 'Coil Q', 100),
  qParam('qc', 'Capacitor Q', 1000),
  enumParam('switchState', 'Switch', [
    ['off', 'Off (open)'],
    ['on', 'On (closed)'],
  ]),
  numParam('ron', 'Switch on-resistance', 'ohm', 1, { min: 0, exclusiveMin: true, max: 1e4 }),
  numParam('coff', 'Switch off-capacitance', 'farad', 0.3e-12, {
    min: 0,
    exclusiveMin: true,
    max: 1e-6,
  }),
];

/** The branch's input admittance as a ComplexFn (allocation-free). */
function admittanceFn(parts: BranchPart[], ctx: BranchContext, end: 'ground' | 'open'): ComplexFn {
  const vec = new Float64Array(4 * (parts.length + 1));
  const m = new Float64Array(8);
  const t = new Float64Array(2);
  return (f, out, o) => {
    branchVectors(parts, ctx, end, f, vec, m, t);
    // Y = I/V at the tap.
    const vr = vec[0];
    const vi = vec[1];
    const d = vr * vr + vi * vi;
    out[o] = (vec[2] * vr + vec[3] * vi) / d;
    out[o + 1] = (vec[3] * vr - vec[2] * vi) / d;
  };
}

/** Each part's stress for a PEAK tap voltage (vRe, vIm) at f. */
function stressFn(parts: BranchPart[], ctx: BranchContext, end: 'ground' | 'open') {
  return (f: number, vRe: number, vIm: number): PartStress[] => {
    const vec = branchVectors(parts, ctx, end, f);
    // Scale the far-end solution so the tap carries the given voltage: s = V/V0.
    const d = vec[0] * vec[0] + vec[1] * vec[1];
    const sr = (vRe * vec[0] + vIm * vec[1]) / d;
    const si = (vIm * vec[0] - vRe * vec[1]) / d;
    const mag = (k: number) => Math.hypot(sr * vec[k] - si * vec[k + 1], sr * vec[k + 1] + si * vec[k]); // prettier-ignore
    const diff = (a: number, b: number) => {
      const re = vec[a] - vec[b];
      const im = vec[a + 1] - vec[b + 1];
      return Math.hypot(sr * re - si * im, sr * im + si * re);
    };
    return parts.map((p, k) => {
      const here = 4 * k;
      const next = 4 * (k + 1);
      let vPeak: number;
      let iPeak: number;
      if (p.kind === 'line') {
        vPeak = Math.max(mag(here), mag(next));
        iPeak = Math.max(mag(here + 2), mag(next + 2));
      } else if (p.place === 'series') {
        vPeak = diff(here, next);
        iPeak = mag(next + 2);
      } else {
        vPeak = mag(here);
        iPeak = diff(here + 2, next + 2);
      }
      const resistive = p.kind === 'R' || (p.kind === 'switch' && ctx.switchClosed);
      const r = p.kind === 'R' ? p.value : ctx.ron;
      const powerW = resistive ? (p.place === 'series' ? (iPeak * iPeak * r) / 2 : (vPeak * vPeak) / (2 * r)) : 0; // prettier-ignore
      return { label: partLabel(p, k), vPeak, iPeak, powerW, ...(p.receiverInput ? { receiverInput: true } : {}) }; // prettier-ignore
    });
  };
}

/** ngspice lines: the parts from the tap (inNode = outNode) to ground. */
function branchSpice(parts: BranchPart[], ctx: BranchContext, end: 'ground' | 'open') {
  return (inNode: string, outNode: string, prefix: string): string[] => {
    const w = new SpiceWriter(prefix);
    w.wire(inNode, outNode);
    let node = inNode;
    parts.forEach((p, k) => {
      const last = k === parts.length - 1;
      const next = p.place === 'series' ? (last && end === 'ground' ? '0' : w.node()) : node;
      const a = node;
      const b = p.place === 'series' ? next : '0';
      if (p.kind === 'line') {
        const delay = (p.length as number) / ((p.vf as number) * 299_792_458);
        w.raw(`T${prefix}_t${k} ${a} 0 ${b} 0 Z0=${p.value} TD=${delay}`);
      } else if (p.kind === 'R') w.resistor(a, b, p.value);
      else if (p.kind === 'L') w.inductor(a, b, p.value, ctx.ql);
      else if (p.kind === 'C') w.capacitor(a, b, p.value, ctx.qc);
      else if (ctx.switchClosed) w.resistor(a, b, ctx.ron);
      else w.capacitor(a, b, ctx.coff);
      node = next;
    });
    const lastPart = parts[parts.length - 1];
    if (end === 'ground' && lastPart.place === 'shunt') w.wire(node, '0');
    // A node left open after a series part gets a leak so ngspice's matrix stays regular.
    if (end === 'open' && lastPart.place === 'series') w.resistor(node, '0', 1e15);
    return w.lines;
  };
}

/** A one-port branch from the path to ground. */
export const SHUNT_BRANCH: StageDefinition = {
  type: 'shunt-branch',
  category: 'element',
  role: 'two-port',
  label: 'Branch to ground',
  summary:
    'A small network from the path to ground — a trap, a stub, an idle transmitter — judged as a block or a short at f0.',
  params: BRANCH_PARAMS,
  build(values, buildCtx) {
    const p = readParams(BRANCH_PARAMS, values);
    const parts = parseBranch(p.str('parts'));
    const ctx: BranchContext = {
      ql: p.num('ql'),
      qc: p.num('qc'),
      switchClosed: p.str('switchState') === 'on',
      ron: p.num('ron'),
      coff: p.num('coff'),
    };
    const end = p.str('end') === 'ground' ? 'ground' : 'open';
    const y = admittanceFn(parts, ctx, end);
    const probe = new Float64Array(2);
    y(buildCtx.f0Hz, probe, 0);
    if (!Number.isFinite(probe[0]) || !Number.isFinite(probe[1]))
      throw new StageParameterError('parts', 'the branch is a dead short to ground (nothing in series before ground); add a series part or end it open'); // prettier-ignore
    const impedance: ComplexFn = (f, out, o) => {
      y(f, out, o);
      const re = out[o];
      const im = out[o + 1];
      const d = re * re + im * im;
      out[o] = d === 0 ? Infinity : re / d;
      out[o + 1] = d === 0 ? Infinity : -im / d;
    };
    const intent = p.str('intent');
    return {
      sections: [shuntSection(y)],
      noise: { kind: 'passive' },
      ...(intent === 'none'
        ? {}
        : { trap: { intent: intent === 'short' ? 'low' : 'high', ratio: p.num('ratio'), impedance } }), // prettier-ignore
      innerParts: stressFn(parts, ctx, end),
      spice: branchSpice(parts, ctx, end),
    };
  },
};
