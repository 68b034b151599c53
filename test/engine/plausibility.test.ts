/**
 * Plausibility of parameter values: every numeric parameter of the catalogue has a hard
 * range (outside it: a ChainValidationError, which the API answers with 422, naming stage,
 * parameter and range) and values outside the typical range are analysed with an
 * `implausible-value` flag. No finite input gives an answer full of nulls (fast-check).
 */
import fc from 'fast-check';
import { analyzeChain, ChainValidationError, STAGE_DEFINITIONS } from '../../shared/engine';
import type { AnalysisResult, ParamSpec, StageDefinition } from '../../shared/engine/types';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const tank = (c: number) =>
  parseChainDocument({
    name: 'tank',
    settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 2e6, points: 21, scale: 'lin' as const } }, // prettier-ignore
    stages: [
      { id: 'g', type: 'resistive-generator', values: {} },
      { id: 't', type: 'shunt-lc-tank', label: 'Tank', values: { l: 25e-6, c } },
      { id: 'l', type: 'rc-load', values: { r: 10e3 } },
    ],
  });

describe('hard and typical ranges of every parameter', () => {
  const numeric = STAGE_DEFINITIONS.flatMap((d) =>
    d.params.filter((p) => p.kind === 'number').map((p) => [`${d.type}.${p.key}`, p] as const),
  );

  it.each(numeric)('%s has a finite hard range holding its default', (_k, p) => {
    expect(Number.isFinite(p.min)).toBe(true);
    expect(Number.isFinite(p.max)).toBe(true);
    expect(p.default as number).toBeGreaterThanOrEqual(p.min!);
    expect(p.default as number).toBeLessThanOrEqual(p.max!);
  });

  it('a 1e99 F capacitor is refused, naming the stage, the parameter and the range', () => {
    let error: unknown;
    try {
      analyzeChain(tank(1e99));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ChainValidationError);
    const [issue] = (error as ChainValidationError).issues;
    expect(issue).toMatchObject({ stageId: 't', param: 'c', path: ['stages', 1, 'values', 'c'] });
    expect(issue.message).toMatch(/^Stage 2 "Tank" \(shunt-lc-tank\): capacitance must be from 0\.1 fF up to 10 kF \(got 1e99 F\)/); // prettier-ignore
  });

  it('a value just above 0 is refused at the unit floor: 5e-324 Ω is no resistor', () => {
    const doc = tank(1e-9);
    doc.stages[0].values = { r: 5e-324 };
    let error: unknown;
    try {
      analyzeChain(doc);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ChainValidationError);
    const [issue] = (error as ChainValidationError).issues;
    expect(issue).toMatchObject({ stageId: 'g', param: 'r' });
    expect(issue.message).toMatch(/source resistance must be from 1 µΩ up to 1 TΩ \(got 5e-324 Ω\)/); // prettier-ignore
  });

  it.each(
    STAGE_DEFINITIONS.flatMap((d) =>
      d.params
        .filter((p) => p.kind === 'number' && p.min !== undefined && p.min > 0 && p.min < 1e-3)
        .map((p) => [`${d.type}.${p.key}`, p] as const),
    ),
  )('%s: a floor below its typical range and its default', (_k, p) => {
    expect(p.exclusiveMin).not.toBe(true);
    expect(p.min!).toBeLessThanOrEqual(p.typical?.min ?? (p.default as number));
    expect(p.min!).toBeLessThanOrEqual(p.default as number);
  });

  it('a 2.2 kF "capacitor" (typed 2.2k) is analysed with a warning naming the typical range', () => {
    const res = analyzeChain(tank(2.2e3));
    const flags = res.flags.filter((f) => f.code === 'implausible-value');
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ stageId: 't', severity: 'warning', data: { param: 'c', value: 2200 } }); // prettier-ignore
    expect(flags[0].message).toMatch(/Capacitance is 2\.2 kF, outside the typical .* to 10 mF/);
  });

  it('a value inside the typical range raises no plausibility flag', () => {
    expect(analyzeChain(tank(1e-9)).flags.map((f) => f.code)).not.toContain('implausible-value');
  });
});

/** A value of one spec, log-uniform over its typical range (or hard range where it has none). */
function typicalValue(p: ParamSpec): fc.Arbitrary<number | string | boolean> {
  if (p.kind === 'enum') return fc.constantFrom(...(p.options ?? []).map((o) => o.value));
  if (p.kind === 'boolean') return fc.boolean();
  if (p.kind !== 'number') return fc.constant(p.default);
  const lo = Math.max(p.typical?.min ?? p.min!, p.min!);
  const hi = Math.min(p.typical?.max ?? p.max!, p.max!);
  const def = p.default as number;
  if (lo > 0 && hi / lo > 10) {
    return fc
      .double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true })
      .map((e) => Math.min(hi, Math.max(lo, 10 ** e)))
      .map((x) => (p.exclusiveMin && x <= p.min! ? def : x));
  }
  return fc.constantFrom(def, lo, hi).map((x) => (p.exclusiveMin && x <= p.min! ? def : x));
}

const byRole = (role: StageDefinition['role']) =>
  STAGE_DEFINITIONS.filter((d) => d.role === role && !d.type.startsWith('measured'));

const stageArb = (defs: StageDefinition[]) =>
  fc
    .constantFrom(...defs)
    .chain((d) =>
      fc
        .record(Object.fromEntries(d.params.map((p) => [p.key, typicalValue(p)])))
        .map((values) => ({ type: d.type, values })),
    );

/** The headline numbers a user reads; JSON turns a NaN or an infinity into null. */
function headline(res: AnalysisResult): unknown[] {
  const json = JSON.parse(JSON.stringify(res)) as AnalysisResult;
  return [
    ...json.nodes.flatMap((n) => [n.zIn.re, n.zIn.im, n.vPeak, n.mismatch]),
    ...json.stages.flatMap((s) => [s.availableGainDb, s.noiseFigureDb]),
    json.levels.noiseFigureDb,
    json.levels.noiseFloorDbm,
    json.levels.systemNoiseTemperatureK,
  ];
}

describe('no finite input gives an answer full of nulls', () => {
  it('property: typical values in any chain analyse to finite headline figures, or are refused', () => {
    fc.assert(
      fc.property(
        stageArb(byRole('source')),
        fc.array(stageArb(byRole('two-port')), { maxLength: 3 }),
        stageArb(byRole('load')),
        fc.double({ min: 4, max: 9, noNaN: true }),
        (source, mids, load, lf) => {
          const f0 = 10 ** lf;
          const doc = parseChainDocument({
            name: 'random chain',
            settings: { f0Hz: f0, sweep: { startHz: f0 / 2, stopHz: f0 * 2, points: 21, scale: 'log' as const } }, // prettier-ignore
            stages: [source, ...mids, load].map((s, i) => ({ id: `s${i}`, ...s })),
          });
          let res: AnalysisResult;
          try {
            res = analyzeChain(doc);
          } catch (e) {
            // A refusal must be the typed one (HTTP 422) and say what to fix.
            expect(e).toBeInstanceOf(ChainValidationError);
            for (const issue of (e as ChainValidationError).issues) {
              expect(issue.message).toMatch(/^Stage \d+ ".*" \([a-z0-9-]+\): .+/);
            }
            return;
          }
          const nulls = headline(res).filter((v) => v === null);
          expect(nulls).toEqual([]);
        },
      ),
      { numRuns: 120, seed: 20261202 },
    );
  });
});
