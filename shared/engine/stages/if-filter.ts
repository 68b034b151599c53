/**
 * IF filter block: a behavioural bandpass (ceramic, crystal or SAW filter) described by its
 * data-sheet figures, matched to its termination impedance at both ports.
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import { numParam, readParams } from './common';
import { matchedThroughAbcd } from './primitives';

const PARAMS = [
  numParam('centreHz', 'Centre frequency', 'hertz', 10.7e6, { min: 0, exclusiveMin: true }),
  numParam('bandwidthHz', 'Bandwidth (−3 dB)', 'hertz', 280e3, { min: 0, exclusiveMin: true }),
  numParam('insertionLossDb', 'Insertion loss', 'db', 6, { min: 0, max: 60 }),
  numParam('ultimateRejectionDb', 'Ultimate rejection', 'db', 60, {
    min: 6,
    max: 200,
    help: 'How far below the passband the response levels off far from the centre.',
  }),
  numParam('order', 'Order (resonators)', 'none', 4, {
    min: 1,
    max: 12,
    help: 'Sets how steep the skirts are (Butterworth shape).',
  }),
  numParam('z0', 'Termination impedance', 'ohm', 330, {
    min: 0,
    exclusiveMin: true,
    help: 'The filter is specified into this resistance at both ports (330 Ω is usual for 10.7 MHz ceramic filters).',
  }),
];

/**
 * Transmission of the block: T = g·√(r² + (1 − r²)·|H|²)·e^{j·arg H}, with g the insertion
 * loss, r the ultimate rejection, and H an order-N Butterworth bandpass in
 * Ω = (f² − f0²)/(f·B′). B′ is widened from the stated B so that |T| is exactly 3 dB
 * below the centre at the edges f1·f2 = f0², f2 − f1 = B.
 */
export function ifFilterTransfer(
  centre: number,
  bandwidth: number,
  order: number,
  rejectionDb: number,
) {
  const r = 10 ** (-rejectionDb / 20);
  const h = (0.5 - r * r) / (1 - r * r);
  const bInner = bandwidth / (1 / h - 1) ** (1 / (2 * order));
  const poleRe = new Float64Array(order);
  const poleIm = new Float64Array(order);
  for (let k = 1; k <= order; k++) {
    const a = (Math.PI * (2 * k + order - 1)) / (2 * order);
    poleRe[k - 1] = Math.cos(a);
    poleIm[k - 1] = Math.sin(a);
  }
  /** Writes T/g (re, im) at f into out[o], out[o+1]. */
  return (f: number, out: Float64Array, o: number): void => {
    const w = (f * f - centre * centre) / (f * bInner);
    // 1/Π(jΩ − p_k)
    let pr = 1;
    let pi = 0;
    for (let k = 0; k < order; k++) {
      const ar = -poleRe[k];
      const ai = w - poleIm[k];
      const nr = pr * ar - pi * ai;
      pi = pr * ai + pi * ar;
      pr = nr;
    }
    const mag2 = 1 / (pr * pr + pi * pi);
    const mag = Math.sqrt(r * r + (1 - r * r) * mag2);
    const phase = -Math.atan2(pi, pr);
    out[o] = mag * Math.cos(phase);
    out[o + 1] = mag * Math.sin(phase);
  };
}

/** IF filter block. */
export const IF_FILTER: StageDefinition = {
  type: 'if-filter',
  category: 'filter',
  role: 'two-port',
  label: 'IF filter block',
  summary: 'A packaged IF filter from its data sheet: centre, bandwidth, loss and rejection.',
  params: PARAMS,
  // Typical data-sheet figures of the trade (common practice, rounded; not a given part).
  presets: [
    {
      key: 'ceramic-455k',
      label: '455 kHz ceramic, 6 kHz wide (typical)',
      values: {
        centreHz: 455e3,
        bandwidthHz: 6e3,
        insertionLossDb: 6,
        ultimateRejectionDb: 40,
        order: 4,
        z0: 1500,
      },
    },
    {
      key: 'ceramic-10m7',
      label: '10.7 MHz ceramic, 280 kHz wide (typical)',
      values: {
        centreHz: 10.7e6,
        bandwidthHz: 280e3,
        insertionLossDb: 6,
        ultimateRejectionDb: 40,
        order: 3,
        z0: 330,
      },
    },
    {
      key: 'crystal-10m7',
      label: '10.7 MHz crystal, 15 kHz wide (typical)',
      values: {
        centreHz: 10.7e6,
        bandwidthHz: 15e3,
        insertionLossDb: 3,
        ultimateRejectionDb: 80,
        order: 8,
        z0: 910,
      },
    },
  ],
  build(values) {
    const p = readParams(PARAMS, values);
    const order = p.num('order');
    if (!Number.isInteger(order)) {
      throw new StageParameterError('order', `the order must be a whole number (got ${order})`);
    }
    const g = 10 ** (-p.num('insertionLossDb') / 20);
    const z0 = p.num('z0');
    const transfer = ifFilterTransfer(
      p.num('centreHz'),
      p.num('bandwidthHz'),
      order,
      p.num('ultimateRejectionDb'),
    );
    const t = new Float64Array(2);
    return {
      sections: [
        {
          abcd(f, out, o) {
            transfer(f, t, 0);
            matchedThroughAbcd(g * t[0], g * t[1], z0, out, o);
          },
        },
      ],
      noise: { kind: 'passive' },
      // No spice: the behavioural response has no exact lumped equivalent.
    };
  },
};
