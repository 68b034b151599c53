/** Small chains of our own for the study tests, with closed-form answers. */
import { chainDocumentSchema, type ChainDocument } from '../../../shared/schema/chain';

const LOSSLESS = 1e12;
const TWO_PI = 2 * Math.PI;

/**
 * A single lossless parallel tank between a 5 kΩ source and a 5 kΩ load: it resonates at
 * 1/(2π√(LC)) and its −3 dB width is 1/(2π·R·C) with R = 2.5 kΩ (both ends in parallel).
 */
export function singleTank(opts: {
  l: number;
  c: number;
  tolerances?: Record<string, number>;
  lTolerance?: number;
  points?: number;
  span?: number;
  targets?: ChainDocument['settings']['targets'];
}): ChainDocument {
  const f0 = 1 / (TWO_PI * Math.sqrt(opts.l * opts.c));
  const span = opts.span ?? 0.1;
  return chainDocumentSchema.parse({
    name: 'Single tank for studies',
    settings: {
      f0Hz: f0,
      sweep: { startHz: f0 * (1 - span), stopHz: f0 * (1 + span), points: opts.points ?? 2001 },
      targets: opts.targets,
    },
    stages: [
      {
        id: 'src',
        type: 'resistive-generator',
        values: { r: 5000, level: 'power', powerDbm: -60 },
      },
      {
        id: 'tank',
        type: 'shunt-lc-tank',
        label: 'Tank',
        values: { l: opts.l, ql: LOSSLESS, c: opts.c, qc: LOSSLESS },
        tolerances: opts.tolerances,
      },
      { id: 'load', type: 'rc-load', values: { r: 5000, c: 0 } },
    ],
  });
}

/**
 * A mediumwave superhet front end: a 50 kΩ antenna coupling, a signal tank with its gang section
 * (`c`), a trimmer stage across it, a mixer with a 455 kHz IF and a high-side LO, an IF load.
 */
export function superhetFrontEnd(rf: { l: number; trimmer: number }, c: number): ChainDocument {
  return chainDocumentSchema.parse({
    name: 'Mediumwave superhet front end',
    settings: { f0Hz: 1e6, sweep: { startHz: 0.8e6, stopHz: 1.25e6, points: 201 } },
    stages: [
      {
        id: 'src',
        type: 'resistive-generator',
        values: { r: 50000, level: 'power', powerDbm: -60 },
      },
      {
        id: 'tank',
        type: 'shunt-lc-tank',
        label: 'Signal tank',
        values: { l: rf.l, ql: LOSSLESS, c, qc: LOSSLESS },
      },
      {
        id: 'trim',
        type: 'lumped-element',
        label: 'Signal trimmer',
        values: { element: 'capacitor', position: 'shunt', c: rf.trimmer, qc: LOSSLESS },
      },
      {
        id: 'mix',
        type: 'mixer',
        values: {
          conversionGainDb: 10,
          nfDb: 10,
          iip3Dbm: 5,
          p1dbDbm: -5,
          rin: 50000,
          rout: 1500,
          conversion: 'down',
          loSource: 'from-if',
          ifHz: 455e3,
          side: 'high',
        },
      },
      { id: 'load', type: 'rc-load', values: { r: 1500, c: 0 } },
    ],
  });
}
