/**
 * The chain at one frequency, without allocating: what the searches for resonances, band
 * edges and peaks call dozens of times per node after the sweep has bracketed what they look
 * for. The formulas are the node analysis's own (see nodes.ts), kept in the same order so a
 * probe and a sweep agree to rounding.
 *
 * A probe evaluates only what the node asked about needs: the backward pass starts at the
 * first unilateral section at or after the node (whatever lies beyond it cannot change the
 * impedance there), and the forward pass stops at the node (a voltage needs no forward pass).
 * The steps across a section are the node analysis's own functions (nodes.ts), called with
 * arrays and indices only, so nothing is boxed or allocated per call. The sections, and the
 * source and load where they have one, are evaluated by their block forms over the one point,
 * the frequency read from `fNode`: a frequency passed as a number to a call the optimiser
 * did not inline is boxed on the heap, which made a few hundred probe calls of an analysis a
 * few hundred kilobytes of garbage.
 */
import { attachment } from './attached';
import type { BuiltChain } from './build';
import { hypot2 } from './hypot';
import { backStep, forwardStep, MIN_NODE_HZ, sourceStep, voltageStep } from './nodes';

const finite = Number.isFinite;
const OPEN = Number.POSITIVE_INFINITY;

/** A reusable single-frequency evaluator of one built chain. */
export interface Probe {
  /** Flat nodes (sections + 1). */
  readonly nodes: number;
  /** After a call: frequency at each flat node evaluated, Hz. */
  readonly fNode: Float64Array;
  /** After a call: impedance toward the load / toward the source at each node evaluated. */
  readonly zinRe: Float64Array;
  readonly zinIm: Float64Array;
  readonly zsrcRe: Float64Array;
  readonly zsrcIm: Float64Array;
  /**
   * Evaluates the chain at input frequency f for node `node`: Zin at nodes node…(first
   * unilateral section after it), Zsrc at nodes 0…node. With `voltage`, Zin at every node
   * up to there and the voltage instead of Zsrc: returns |V[node]|/|Es| (NaN otherwise).
   */
  at(f: number, node: number, voltage?: boolean): number;
  /** The total admittance at `node` (source and load sides) after `at`: writes G, B. */
  nodeAdmittance(node: number, out: Float64Array): void;
  /**
   * The admittance at `node` with the network cut open at node `cut` (≥ node): the source
   * side plus the sections node…cut−1 ending in an open circuit. Call after `at(f, node)`.
   */
  cutAdmittance(node: number, cut: number, out: Float64Array): void;
}

/** Adds 1/(re + j·im) into out[0], out[1]; an open side adds nothing, a short adds ∞. */
export function addInverse(re: number, im: number, out: Float64Array): void {
  if (!finite(re) || !finite(im)) return;
  const d = re * re + im * im;
  out[0] += d === 0 ? OPEN : re / d;
  out[1] += d === 0 ? 0 : -im / d;
}

/** The probe of each built chain that asked for one (see {@link probeOf}). */
const probes = attachment<BuiltChain, Probe>('probe');

/**
 * The probe of a built chain, made on first use and kept with the chain: an analysis's
 * resonator search and selectivity evaluate the same chain, one after the other, and its
 * dozen arrays need not be made twice. A probe keeps nothing between calls that a later call
 * reads, so whoever takes it next sees the same numbers.
 */
export function probeOf(built: BuiltChain): Probe {
  let probe = probes.get(built);
  if (!probe) probes.set(built, (probe = createProbe(built)));
  return probe;
}

/** Makes a probe for a built chain; reuse it for every evaluation of that chain. */
export function createProbe(built: BuiltChain): Probe {
  const sections = built.sections;
  const N = sections.length;
  const fNode = new Float64Array(N + 1);
  const zinRe = new Float64Array(N + 1);
  const zinIm = new Float64Array(N + 1);
  const zsrcRe = new Float64Array(N + 1);
  const zsrcIm = new Float64Array(N + 1);
  const m = new Float64Array(8 * N);
  const t = new Float64Array(2);
  // First unilateral section at or after each node (N when none).
  const stopAt = new Int32Array(N + 1).fill(N);
  for (let j = N - 1; j >= 0; j--) stopAt[j] = sections[j].unilateral ? j : stopAt[j + 1];
  // Sections that pass the voltage through (Section.ladder 'shunt'), as the node analysis takes them.
  const shunt = Uint8Array.from(sections, (s) => (s.ladder === 'shunt' ? 1 : 0));
  const zl = built.load.model.impedance!;
  const zs = built.source.model.impedance!;
  const es = built.source.model.emf!;

  // Voltages for stepUpTo, and the source EMF as a one-slot array for sourceStep.
  const vRe = new Float64Array(N + 1);
  const vIm = new Float64Array(N + 1);
  const emf = new Float64Array(1);

  function at(f: number, node: number, voltage = false): number {
    const last = stopAt[node];
    const end = last < N ? last + 1 : N; // sections 0 … end−1 are needed
    fNode[0] = f;
    for (let j = 0; j < end; j++) {
      const s = sections[j];
      // The block form over the one point (what the node analysis runs, and equal to the
      // point form): the frequency is read from fNode, so no number is boxed for the call.
      s.fill(fNode, j, 1, m, 8 * j);
      const tr = s.translate;
      fNode[j + 1] = tr ? Math.max(tr(fNode[j]), MIN_NODE_HZ) : fNode[j];
    }
    if (end === N) {
      if (zl.fill) zl.fill(fNode, N, 1, t, 0, 2);
      else zl(fNode[N], t, 0);
      zinRe[N] = t[0];
      zinIm[N] = t[1];
    } else {
      zinRe[end] = OPEN; // beyond a unilateral section: anything gives the same Zin before it
      zinIm[end] = 0;
    }
    const from = voltage ? 0 : node;
    for (let j = end - 1; j >= from; j--) backStep(m, 8 * j, zinRe, zinIm, j + 1, j);
    if (zs.fill) zs.fill(fNode, 0, 1, t, 0, 2);
    else zs(f, t, 0);
    zsrcRe[0] = t[0];
    zsrcIm[0] = t[1];
    if (voltage) return stepUpTo(node);
    for (let j = 0; j < node; j++) forwardStep(m, 8 * j, zsrcRe, zsrcIm, j, j + 1);
    return NaN;
  }

  /** |V[node]|/|Es| from the voltage divider at node 0 and the voltage steps (nodes.ts). */
  function stepUpTo(node: number): number {
    if (es.fill) es.fill(fNode, 0, 1, emf, 0);
    else emf[0] = es(fNode[0]);
    const e = emf[0];
    sourceStep(emf, zsrcRe, zsrcIm, zinRe, zinIm, vRe, vIm, 0, 0);
    for (let j = 0; j < node; j++) voltageStep(m, 8 * j, zinRe, zinIm, vRe, vIm, j, j + 1, shunt[j] === 1); // prettier-ignore
    return hypot2(vRe[node], vIm[node]) / Math.abs(e);
  }

  function nodeAdmittance(node: number, out: Float64Array): void {
    out[0] = 0;
    out[1] = 0;
    addInverse(zsrcRe[node], zsrcIm[node], out);
    addInverse(zinRe[node], zinIm[node], out);
  }

  // Scratch for the cut-open backward pass (kept apart from the probe's own Zin).
  const cutRe = new Float64Array(N + 1);
  const cutIm = new Float64Array(N + 1);
  function cutAdmittance(node: number, cut: number, out: Float64Array): void {
    out[0] = 0;
    out[1] = 0;
    addInverse(zsrcRe[node], zsrcIm[node], out);
    if (cut <= node) return;
    cutRe[cut] = OPEN;
    cutIm[cut] = 0;
    // Open at the cut: Zin = A/C, then the usual bilinear step.
    for (let j = cut - 1; j >= node; j--) backStep(m, 8 * j, cutRe, cutIm, j + 1, j);
    addInverse(cutRe[node], cutIm[node], out);
  }

  return { nodes: N + 1, fNode, zinRe, zinIm, zsrcRe, zsrcIm, at, nodeAdmittance, cutAdmittance }; // prettier-ignore
}
