/**
 * The benchmark's chain: an antenna, twelve two-port stages and a detector, every stage
 * expressible in SPICE so ngspice can run the same chain. A scenario of our own.
 */
import type { ChainDocumentInput } from '../../shared/schema/chain';

type Stage = ChainDocumentInput['stages'][number];
const st = (id: string, type: string, values: Stage['values'] = {}): Stage => ({
  id,
  type,
  label: id,
  values,
});

/** The 12-two-port chain with a linear sweep of `points` from 5 to 9 MHz (f0 = 7 MHz). */
export function benchChain(points: number): ChainDocumentInput {
  return {
    name: `Benchmark: 12 two-ports over ${points} points`,
    settings: {
      f0Hz: 7e6,
      sweep: { startHz: 5e6, stopHz: 9e6, points, scale: 'lin' },
      offsetsHz: [10e3, 100e3],
    },
    stages: [
      st('whip', 'short-monopole', { height: 1.5, diameter: 1.5e-3, lossR: 3 }),
      st('switch', 'tr-switch', {
        insertionLossDb: 0.5,
        isolationDb: 40,
        state: 'receive',
        z0: 50,
      }),
      st('link', 'coupled-coils', { l1: 1e-6, l2: 1e-5, k: 0.3, q1: 80, q2: 150 }),
      st('tank', 'shunt-lc-tank', { l: 1e-5, ql: 150, c: 5.17e-11, qc: 800 }),
      st('lna', 'unilateral-amplifier', {}),
      st('pi', 'pi-match', { mode: 'design', r1: 5000, r2: 50, q: 12 }),
      st('pad', 'attenuator-pad', { db: 3, z0: 50, form: 'pi' }),
      st('feeder', 'transmission-line', { z0: 50, length: 2, vf: 0.66 }),
      st('preselector', 'coupled-bandpass', { coupling: 'top-c', l: 1e-6, c: 517e-12, cc: 18e-12 }),
      st('match', 'l-match', { orientation: 'series-l-shunt-c', mode: 'design', r1: 50, r2: 1000 }),
      st('trap', 'series-lc', { l: 4.7e-6, ql: 60, c: 48e-12, qc: 900 }),
      st('buffer', 'triode-amplifier', {}),
      st('tcm', 'tapped-c-match', { mode: 'design', r1: 10000, r2: 1000, q: 6 }),
      st('det', 'envelope-detector', { rLoad: 47000, c: 4e-12 }),
    ],
  };
}
