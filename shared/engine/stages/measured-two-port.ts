/**
 * Measured two-port: S-parameters (from an attached two-port data file, or a short text
 * table) interpolated linearly in frequency and turned into ABCD.
 */
import { StageParameterError } from '../errors';
import type { AbcdFn, MeasuredNetwork, StageDefinition } from '../types';
import { enumParam, numParam, readParams } from './common';
import { interpolate, parseTable, sTableFromNetwork, type SampleTable } from './measured-data';
import { cdiv, cmul } from './primitives';

/**
 * Standard S → ABCD conversion for a real reference z0:
 * A = ((1+S11)(1−S22) + S12·S21)/(2·S21), B = z0·((1+S11)(1+S22) − S12·S21)/(2·S21),
 * C = ((1−S11)(1−S22) − S12·S21)/(2·S21·z0), D = ((1−S11)(1+S22) + S12·S21)/(2·S21).
 * s holds [S11re, S11im, S21re, S21im, S12re, S12im, S22re, S22im] at s[so..so+7].
 */
export function sToAbcd(
  s: Float64Array,
  so: number,
  z0: number,
  out: Float64Array,
  o: number,
): void {
  const s11r = s[so];
  const s11i = s[so + 1];
  const s21r = s[so + 2];
  const s21i = s[so + 3];
  const s12r = s[so + 4];
  const s12i = s[so + 5];
  const s22r = s[so + 6];
  const s22i = s[so + 7];
  // x = S12·S21, computed before `out` is written (s and out may be the same array).
  const xr = s12r * s21r - s12i * s21i;
  const xi = s12r * s21i + s12i * s21r;
  const tr = 2 * s21r;
  const ti = 2 * s21i;
  cmul(1 + s11r, s11i, 1 - s22r, -s22i, out, o);
  cdiv(out[o] + xr, out[o + 1] + xi, tr, ti, out, o);
  cmul(1 + s11r, s11i, 1 + s22r, s22i, out, o + 2);
  cdiv(z0 * (out[o + 2] - xr), z0 * (out[o + 3] - xi), tr, ti, out, o + 2);
  cmul(1 - s11r, -s11i, 1 - s22r, -s22i, out, o + 4);
  cdiv((out[o + 4] - xr) / z0, (out[o + 5] - xi) / z0, tr, ti, out, o + 4);
  cmul(1 - s11r, -s11i, 1 + s22r, s22i, out, o + 6);
  cdiv(out[o + 6] + xr, out[o + 7] + xi, tr, ti, out, o + 6);
}

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
  return (f, out, o) => {
    interpolate(table, f, s, 0);
    sToAbcd(s, 0, z0, out, o);
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
