/**
 * Measured two-port: S-parameters (from an attached two-port data file, or a short text
 * table) interpolated linearly in frequency and turned into ABCD.
 */
import { StageParameterError } from '../errors';
import type { AbcdFn, MeasuredNetwork, StageDefinition } from '../types';
import { enumParam, numParam, readParams } from './common';
import { interpolate, parseTable, sTableFromNetwork, type SampleTable } from './measured-data';
import { sToAbcdAt } from '../core/abcd';

/** ABCD over frequency of a measured two-port: the interface the data-file reader feeds. */
export function measuredTwoPort(net: MeasuredNetwork): AbcdFn {
  const { table, z0 } = sTableFromNetwork(net);
  return abcdFromTable(table, z0);
}

function abcdFromTable(table: SampleTable, z0: number): AbcdFn {
  for (let i = 0; i < table.f.length; i++) {
    if (table.values[8 * i + 2] === 0 && table.values[8 * i + 3] === 0) {
      throw new StageParameterError(
        'table',
        `S21 is 0 at ${table.f[i]} Hz: a two-port with no transmission cannot sit in the chain`,
      );
    }
  }
  const s = new Float64Array(8);
  const rows = new Float64Array(8);
  return (f, out, o) => {
    // The table holds [S11, S21, S12, S22] (the Touchstone 1.x order); the conversion
    // reads S in row order [S11, S12, S21, S22].
    interpolate(table, f, s, 0);
    rows.set(s.subarray(0, 2), 0);
    rows.set(s.subarray(4, 6), 2);
    rows.set(s.subarray(2, 4), 4);
    rows.set(s.subarray(6, 8), 6);
    sToAbcdAt(rows, 0, z0, z0, out, o);
  };
}

const PARAMS = [
  {
    key: 'table',
    label: 'S-parameter points',
    kind: 'text' as const,
    unit: 'none' as const,
    default: '1e7 0 0 0.5 0 0.5 0 0 0',
    help:
      'Used when no two-port data file is attached: "f S11re S11im S21re S21im S12re S12im ' +
      'S22re S22im; ..." (Hz, linear).',
  },
  numParam('z0', 'Reference impedance of the table', 'ohm', 50, { min: 0, exclusiveMin: true }),
  enumParam('noise', 'Noise', [
    ['passive', 'Passive (noise from its loss)'],
    ['figure', 'Stated noise figure (active device)'],
  ]),
  numParam('nfDb', 'Noise figure', 'db', 3, {
    min: 0,
    max: 40,
    showWhen: { key: 'noise', equals: 'figure' },
  }),
];

/** Measured two-port (filter, amplifier or anything characterised by S-parameters). */
export const MEASURED_TWO_PORT: StageDefinition = {
  type: 'measured-two-port',
  category: 'filter',
  role: 'two-port',
  label: 'Measured two-port',
  summary: 'Any two-port from measured S-parameters, interpolated between the points.',
  params: PARAMS,
  build(values, ctx) {
    const p = readParams(PARAMS, values);
    const abcd = ctx.dataFile
      ? measuredTwoPort(ctx.dataFile)
      : abcdFromTable(
          parseTable(
            p.str('table'),
            8,
            'table',
            'f S11re S11im S21re S21im S12re S12im S22re S22im',
          ),
          p.num('z0'),
        );
    return {
      sections: [{ abcd }],
      noise:
        p.str('noise') === 'figure'
          ? {
              kind: 'figure',
              nfDb: p.num('nfDb'),
              // A measured figure holds at the reference impedance it was measured in.
              ratedSourceOhm: ctx.dataFile ? ctx.dataFile.points[0].z0 : p.num('z0'),
            }
          : { kind: 'passive' },
    };
  },
};
