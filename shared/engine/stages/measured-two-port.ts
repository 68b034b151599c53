/**
 * Measured two-port: S-parameters (from an attached two-port data file, or a short text
 * table) interpolated linearly in frequency and turned into ABCD. Its noise is its loss
 * (passive), a stated figure, or the data file's own noise parameters, which the engine
 * evaluates at the source impedance the stage really sees.
 */
import { StageParameterError } from '../errors';
import type {
  AbcdFn,
  MeasuredNetwork,
  MeasuredNoisePoint,
  NoiseDecl,
  StageDefinition,
} from '../types';
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
  enumParam(
    'noise',
    'Noise',
    [
      // The card writes the label before the choice ("Noise Stated figure…"): no repeats.
      ['passive', 'Passive, from its loss'],
      ['figure', 'Stated figure (active device)'],
      ['file', 'Parameters from the data file (active device)'],
    ],
    {
      help:
        'A data file with a noise block (NFmin, optimum source reflection, Rn) gives the noise ' +
        'figure at the source impedance the stage really sees, not only at the optimum.',
    },
  ),
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
      noise: noiseOf(p.str('noise'), p.num('nfDb'), p.num('z0'), ctx),
    };
  },
};

function noiseOf(
  mode: string,
  nfDb: number,
  tableZ0: number,
  ctx: { f0Hz: number; dataFile?: MeasuredNetwork },
): NoiseDecl {
  if (mode === 'figure') {
    // A measured figure holds at the reference impedance it was measured in.
    return {
      kind: 'figure',
      nfDb,
      ratedSourceOhm: ctx.dataFile ? ctx.dataFile.points[0].z0 : tableZ0,
    };
  }
  if (mode !== 'file') return { kind: 'passive' };
  const noise = ctx.dataFile?.noise;
  if (!noise || noise.length === 0) {
    throw new StageParameterError(
      'noise',
      ctx.dataFile
        ? 'the attached data file has no noise parameters; attach one with a noise block or choose a stated noise figure'
        : 'noise parameters come from a two-port data file; attach one or choose a stated noise figure',
    );
  }
  return noiseParametersAt(noise, ctx.f0Hz);
}

/**
 * The engine's noise-parameter declaration at f (linear interpolation of NFmin in dB, Γopt
 * re/im and Rn between the file's noise frequencies; the end values held outside them).
 * Yopt = 1/Zopt with Zopt = z0·(1 + Γopt)/(1 − Γopt).
 */
export function noiseParametersAt(noise: readonly MeasuredNoisePoint[], f: number): NoiseDecl {
  const table: SampleTable = {
    f: Float64Array.from(noise, (n) => n.fHz),
    width: 4,
    values: Float64Array.from(
      noise.flatMap((n) => [n.nfMinDb, n.gammaOpt.re, n.gammaOpt.im, n.rnOhm]),
    ),
  };
  const v = new Float64Array(4);
  interpolate(table, f, v, 0);
  const [fminDb, gr, gi, rn] = v;
  const z0 = noise[0].z0;
  // Yopt = (1 − Γ)/(z0·(1 + Γ))
  const nr = 1 - gr;
  const ni = -gi;
  const dr = z0 * (1 + gr);
  const di = z0 * gi;
  const d = dr * dr + di * di;
  if (!(d > 0)) {
    throw new StageParameterError(
      'noise',
      'the file gives Γopt = −1 (a short), which no source can present',
    );
  }
  return {
    kind: 'parameters',
    fminDb,
    rn,
    yoptRe: (nr * dr + ni * di) / d,
    yoptIm: (ni * dr - nr * di) / d,
  };
}
