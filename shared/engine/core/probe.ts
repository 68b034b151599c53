/**
 * Single-frequency evaluations of a built chain, for searches that refine a frequency
 * (resonances, band edges) after the sweep has bracketed it.
 *
 * A probe is a workspace of one point per flat node. Each call evaluates only the sections
 * it needs, each once, with the steps of the node analysis (`nodes.ts`), so a probe gives
 * the numbers a one-point node analysis would, and allocates nothing after it is made:
 * - {@link probeZin}: Zin at node k, from sections k … N−1 (load side only);
 * - {@link probeZsrc}: Zsrc at node k, from sections 0 … k−1 (source side only);
 * - {@link probeVoltage}: V at node k, from every section's Zin and the forward pass up to k.
 * Frequencies after a mixer follow the sections' `translate` (floored at 1 mHz, as in the
 * node analysis).
 */
import type { ComplexFn } from '../types';
import type { BuiltChain } from './build';
import { backStep, forwardStep, MIN_NODE_HZ, sourceStep, voltageStep } from './nodes';

const { max } = Math;

/** One point per flat node; read results at index k after a probe of node k. */
export interface Probe {
  /** Input frequency of the last probe, Hz. */
  fHz: number;
  /** Frequency at each flat node, Hz. */
  fNode: Float64Array;
  zinRe: Float64Array;
  zinIm: Float64Array;
  zsrcRe: Float64Array;
  zsrcIm: Float64Array;
  /** Node voltage (PEAK phasor, volts) and the source EMF (PEAK volts) in emf[0]. */
  vRe: Float64Array;
  vIm: Float64Array;
  emf: Float64Array;
  /** ABCD of each section at the last probe, 8 slots at 8·j. */
  abcd: Float64Array;
  /** Scratch for one-port values. */
  pair: Float64Array;
}

/** A probe for `built` (reuse it for every evaluation of that chain). */
export function createProbe(built: BuiltChain): Probe {
  const nodes = built.sections.length + 1;
  return {
    fHz: NaN,
    fNode: new Float64Array(nodes),
    zinRe: new Float64Array(nodes),
    zinIm: new Float64Array(nodes),
    zsrcRe: new Float64Array(nodes),
    zsrcIm: new Float64Array(nodes),
    vRe: new Float64Array(nodes),
    vIm: new Float64Array(nodes),
    emf: new Float64Array(1),
    abcd: new Float64Array(8 * built.sections.length),
    pair: new Float64Array(2),
  };
}

/** Frequencies at every flat node for input frequency fHz. */
function setFrequency(built: BuiltChain, p: Probe, fHz: number): void {
  if (p.fHz === fHz) return;
  p.fHz = fHz;
  const f = p.fNode;
  f[0] = fHz;
  const sections = built.sections;
  for (let j = 0; j < sections.length; j++) {
    const tr = sections[j].translate;
    f[j + 1] = tr ? max(tr(f[j]), MIN_NODE_HZ) : f[j];
  }
}

function oneport(fn: ComplexFn, p: Probe, node: number, re: Float64Array, im: Float64Array): void {
  if (fn.fill) fn.fill(p.fNode, node, 1, p.pair, 0, 2);
  else fn(p.fNode[node], p.pair, 0);
  re[node] = p.pair[0];
  im[node] = p.pair[1];
}

/** Zin at flat node k (and at every node after it) at input frequency fHz. */
export function probeZin(built: BuiltChain, p: Probe, fHz: number, k: number): void {
  setFrequency(built, p, fHz);
  const N = built.sections.length;
  oneport(built.load.model.impedance, p, N, p.zinRe, p.zinIm);
  for (let j = N - 1; j >= k; j--) {
    built.sections[j].fill(p.fNode, j, 1, p.abcd, 8 * j);
    backStep(p.abcd, 8 * j, p.zinRe, p.zinIm, j + 1, j);
  }
}

/** Zsrc at flat node k (and at every node before it) at input frequency fHz. */
export function probeZsrc(built: BuiltChain, p: Probe, fHz: number, k: number): void {
  setFrequency(built, p, fHz);
  oneport(built.source.model.impedance, p, 0, p.zsrcRe, p.zsrcIm);
  for (let j = 0; j < k; j++) {
    built.sections[j].fill(p.fNode, j, 1, p.abcd, 8 * j);
    forwardStep(p.abcd, 8 * j, p.zsrcRe, p.zsrcIm, j, j + 1);
  }
}

/**
 * The node voltage at flat node k (and every node before it) at input frequency fHz, with
 * Zin at every node and Zsrc up to node k. |V[k]|/emf[0] is the step-up.
 */
export function probeVoltage(built: BuiltChain, p: Probe, fHz: number, k: number): void {
  probeZin(built, p, fHz, 0);
  const src = built.source.model;
  if (src.emf.fill) src.emf.fill(p.fNode, 0, 1, p.emf, 0);
  else p.emf[0] = src.emf(fHz);
  oneport(src.impedance, p, 0, p.zsrcRe, p.zsrcIm);
  sourceStep(p.emf, p.zsrcRe, p.zsrcIm, p.zinRe, p.zinIm, p.vRe, p.vIm, 0, 0);
  for (let j = 0; j < k; j++) {
    forwardStep(p.abcd, 8 * j, p.zsrcRe, p.zsrcIm, j, j + 1);
    voltageStep(p.abcd, 8 * j, p.zinRe, p.zinIm, p.vRe, p.vIm, j, j + 1);
  }
}
