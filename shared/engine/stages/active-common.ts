/**
 * What amplifiers and mixers share: the unilateral Y-parameter section
 * (y11 = 1/Rin + jωCin, y22 = 1/Rout + jωCout, y12 = 0) and what "stated gain" means.
 *
 * Sign convention. An inverting stage (common emitter, common source, grounded cathode)
 * has a voltage gain of −gm·R_L: as the input rises, the device draws gm·V1 out of its
 * output node. With both port currents counted INTO the two-port (the usual Y-parameter
 * convention, as in the hybrid-π model where the collector current is +gm·v_be) that is
 * y21 = +gm. A non-inverting stage (common base, common gate, and a block given only by a
 * stated gain, which has no phase of its own) pushes gm·V1 into its output node:
 * y21 = −gm, voltage gain +gm·R_L. The SPICE writer follows the same convention (see
 * `amplifiers.ts`).
 *
 * Stated gain G (linear power ratio) is the available power gain when the stage is driven
 * from a source resistance equal to Rin, capacitances left out; it is also the transducer
 * gain into a load equal to Rout. With V1 = Es/2 and the output current gm·V1 into
 * Rout ∥ Rout: G = gm²·Rin·Rout/4, so gm = 2·√(G/(Rin·Rout)).
 */
import type { Section } from '../types';
import { sectionFromFill } from './common';
import { fillUnilateral } from './primitives';

export interface UnilateralPorts {
  rin: number;
  cin: number;
  rout: number;
  cout: number;
  gm: number;
  /** Whether the stage inverts (voltage gain −gm·R_L). Default: non-inverting. */
  inverting?: boolean;
}

/** Transconductance (S) giving the stated available power gain (dB) between rin and rout. */
export function gmForStatedGain(gainDb: number, rin: number, rout: number): number {
  return 2 * Math.sqrt(10 ** (gainDb / 10) / (rin * rout));
}

/** Available power gain (dB) of gm between rin and rout (capacitances left out). */
export function statedGainForGm(gm: number, rin: number, rout: number): number {
  return 10 * Math.log10((gm * gm * rin * rout) / 4);
}

/** The unilateral section; `translate` for mixers. */
export function unilateralSection(
  ports: UnilateralPorts,
  translate?: (f: number) => number,
): Section {
  const { rin, cin, rout, cout, gm } = ports;
  // fillUnilateral writes y21 = −(its gm argument): a non-inverting stage passes gm, an
  // inverting one −gm (y21 = +gm).
  const g = ports.inverting === true ? -gm : gm;
  return sectionFromFill(
    (f, fo, n, out, oo) => fillUnilateral(rin, cin, rout, cout, g, translate, f, fo, n, out, oo),
    { unilateral: true, translate },
  );
}
