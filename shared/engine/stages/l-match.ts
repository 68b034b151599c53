/**
 * L-section matching network in its four orientations.
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import { enumParam } from './common';
import { buildMatching, componentParam, matchingParams } from './matching-common';
import type { LadderElement } from './ladder';

const ORIENTATIONS: [string, string][] = [
  ['series-l-shunt-c', 'Series L, then shunt C (low-pass, steps up)'],
  ['shunt-c-series-l', 'Shunt C, then series L (low-pass, steps down)'],
  ['series-c-shunt-l', 'Series C, then shunt L (high-pass, steps up)'],
  ['shunt-l-series-c', 'Shunt L, then series C (high-pass, steps down)'],
];

const PARAMS = [
  enumParam('orientation', 'Orientation', ORIENTATIONS),
  ...matchingParams(false),
  componentParam('l', 'Inductance', 'henry', 4.192e-6),
  componentParam('c', 'Capacitance', 'farad', 558.9e-12),
];

/** L-section: one series and one shunt reactance. */
export const L_MATCH: StageDefinition = {
  type: 'l-match',
  category: 'matching',
  role: 'two-port',
  label: 'L-section match',
  summary:
    'Two reactances, one in series and one across, matching two resistances at one frequency.',
  params: PARAMS,
  build(values, ctx) {
    return buildMatching(
      PARAMS,
      values,
      ctx,
      (p) => (p.str('orientation').includes('shunt-c') ? 'l-lowpass' : 'l-highpass'),
      (parts, p) => {
        const o = p.str('orientation');
        const l: LadderElement = { part: 'L', place: 'series', value: parts.l, q: p.num('ql') };
        const c: LadderElement = { part: 'C', place: 'series', value: parts.c, q: p.num('qc') };
        if (o === 'series-l-shunt-c') return [l, { ...c, place: 'shunt' }];
        if (o === 'shunt-c-series-l') return [{ ...c, place: 'shunt' }, l];
        if (o === 'series-c-shunt-l') return [c, { ...l, place: 'shunt' }];
        return [{ ...l, place: 'shunt' }, c];
      },
      ['l', 'c'],
      (design, p) => {
        const shuntFirst = p.str('orientation').startsWith('shunt');
        if (shuntFirst !== (design.shuntAt === 'port1')) {
          throw new StageParameterError(
            'orientation',
            `the shunt element must sit across the higher resistance: with R1 = ${p.num('r1')} Ω ` +
              `and R2 = ${p.num('r2')} Ω choose a ${design.shuntAt === 'port1' ? 'shunt' : 'series'}-first orientation`,
          );
        }
      },
    );
  },
};
