/**
 * Validation and building: every problem collected with its path and a message naming the
 * stage and parameter; defaults; hidden values; roles; builder errors; the flat layout.
 */
import { ChainValidationError, type ChainIssue } from '../../shared/engine/errors';
import { buildChain } from '../../shared/engine/core/build';
import { frequencyGrid } from '../../shared/engine/core/sweep';
import { ChainDocumentError, parseChainDocument } from '../../shared/schema/parse-chain';
import { chain, TEST_CATALOGUE } from './core-fixtures';

function issuesOf(run: () => unknown): ChainIssue[] {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(ChainValidationError);
    return (e as ChainValidationError).issues;
  }
  throw new Error('expected a ChainValidationError');
}

const SRC = { type: 't-source' };
const LOAD = { type: 't-load' };

describe('buildChain validation', () => {
  it('takes settings the schema checked: f0 = 0, NaN and Infinity are refused by the parse, naming the field', () => {
    for (const bad of [0, -1, NaN, Infinity]) {
      const raw = { name: 'c', settings: { f0Hz: bad, sweep: { startHz: 1, stopHz: 2, points: 3 } }, stages: [SRC, LOAD].map((s, i) => ({ ...s, id: `s${i}` })) }; // prettier-ignore
      expect(() => parseChainDocument(raw)).toThrow(ChainDocumentError);
      expect(() => parseChainDocument(raw)).toThrow(/\$\.settings\.f0Hz: design frequency must/);
    }
  });

  it('names stage and parameter for NaN, Infinity and negative values, collecting all', () => {
    const doc = chain(
      [
        SRC,
        { type: 't-tank', label: 'Tuner' },
        { type: 't-shunt-r', label: 'Detector', values: { r: -5 } },
        LOAD,
      ],
      { f0Hz: 1e6 },
    );
    // JSON has no NaN or Infinity and the schema refuses them; the engine still names them
    // when a caller sets them on a parsed document.
    doc.stages[1].values = { l: NaN, c: Infinity };
    const issues = issuesOf(() => buildChain(doc, TEST_CATALOGUE));
    expect(issues.map((i) => i.path)).toEqual([
      ['stages', 1, 'values', 'l'],
      ['stages', 1, 'values', 'c'],
      ['stages', 2, 'values', 'r'],
    ]);
    expect(issues[0].message).toBe('Stage 2 "Tuner" (t-tank): inductance must be a finite number (got NaN)'); // prettier-ignore
    expect(issues[1].message).toMatch(/capacitance must be a finite number \(got Infinity\)/);
    expect(issues[2].message).toBe('Stage 3 "Detector" (t-shunt-r): load resistance must be above 0 Ω (got -5)'); // prettier-ignore
    expect(issues[2]).toMatchObject({ stageId: 's2', stageIndex: 2, param: 'r' });
  });

  it('keeps acronyms in parameter names as written', () => {
    const doc = chain([SRC, { type: 't-amp' }, LOAD], { f0Hz: 1e6 });
    doc.stages[1].values.iip3 = NaN;
    const [issue] = issuesOf(() => buildChain(doc, TEST_CATALOGUE));
    expect(issue.message).toBe(
      'Stage 2 "Amplifier" (t-amp): IIP3 must be a finite number (got NaN)',
    );
  });

  it('refuses an unknown type, a wrong kind of value and a bad enum option', () => {
    const doc = chain(
      [SRC, { type: 'no-such-stage' }, { type: 't-series', values: { r: 'ten' } }, { type: 't-load', values: { mode: 'ajar' } }], // prettier-ignore
      { f0Hz: 1e6 },
    );
    const issues = issuesOf(() => buildChain(doc, TEST_CATALOGUE));
    expect(issues.map((i) => i.message)).toEqual([
      'Stage 2 "no-such-stage" (no-such-stage): unknown stage type "no-such-stage"; choose one from the stage catalogue', // prettier-ignore
      'Stage 3 "Series RLC" (t-series): resistance must be a number (got "ten")',
      'Stage 4 "Test load" (t-load): termination must be one of r, open, short (got "ajar")',
    ]);
  });

  it('checks roles: a source first, a load last, two-ports between', () => {
    const issues = issuesOf(() =>
      buildChain(chain([LOAD, SRC, SRC], { f0Hz: 1e6 }), TEST_CATALOGUE),
    );
    expect(issues.map((i) => i.path)).toEqual([
      ['stages', 0, 'type'],
      ['stages', 1, 'type'],
      ['stages', 2, 'type'],
    ]);
    expect(issues[0].message).toMatch(/the first stage must be a source/);
    expect(issues[2].message).toMatch(/the last stage must be a load/);
  });

  it('fills defaults and ignores values hidden by showWhen', () => {
    const doc = chain([SRC, { type: 't-load', values: { mode: 'open', r: -1 } }], { f0Hz: 1e6 });
    const built = buildChain(doc, TEST_CATALOGUE);
    expect(built.source.values).toEqual({ rs: 50, xs: 0, emf: 1 });
    expect(built.load.values['r']).toBe(50); // the hidden −1 is neither checked nor used
  });

  it('turns a StageParameterError from a builder into an issue on that parameter', () => {
    const doc = chain([SRC, { type: 't-mixer', values: { lo: 1e6 } }, LOAD], { f0Hz: 1e6 });
    const issues = issuesOf(() => buildChain(doc, TEST_CATALOGUE));
    expect(issues).toEqual([
      {
        stageId: 's1',
        stageIndex: 1,
        param: 'lo',
        path: ['stages', 1, 'values', 'lo'],
        message: 'Stage 2 "Mixer" (t-mixer): LO frequency must differ from the signal frequency',
      },
    ]);
  });

  it('checks text values and hands an attached data file to the builder', () => {
    const long = chain([SRC, { type: 't-measured-load' }], { f0Hz: 1e6 });
    long.stages[1].values.table = 'x'.repeat(201); // past the schema's own limit
    const [issue] = issuesOf(() => buildChain(long, TEST_CATALOGUE));
    expect(issue.message).toBe('Stage 2 "Measured load" (t-measured-load): table must be at most 200 characters (got 201)'); // prettier-ignore
    const doc = chain([SRC, { type: 't-measured-load' }], { f0Hz: 1e6 });
    doc.stages[1].dataFileId = 'f1';
    // S11 = 0.5 against 50 Ω is 150 Ω (Z = Z0·(1 + S11)/(1 − S11))
    const file = { ports: 1 as const, points: [{ f: 1e6, z0: 50, s11: { re: 0.5, im: 0 } }] };
    const built = buildChain(doc, TEST_CATALOGUE, { dataFiles: { f1: file } });
    const z = new Float64Array(2);
    built.load.model.impedance(1e6, z, 0);
    expect(z[0]).toBeCloseTo(150, 12);
    const missing = issuesOf(() => buildChain(doc, TEST_CATALOGUE, { dataFiles: {} }));
    expect(missing[0]).toMatchObject({ path: ['stages', 1, 'dataFileId'], message: expect.stringMatching(/data file "f1" was not found/) }); // prettier-ignore
    expect(() => buildChain(doc, TEST_CATALOGUE)).not.toThrow(); // no files resolved: the text table is used
  });

  it('leaves something that is not a chain at all to the parse, which names the path', () => {
    for (const bad of [null, undefined, 42, 'chain']) {
      expect(() => parseChainDocument(bad)).toThrow(
        /^the chain document is not a valid chain: \$: /,
      );
    }
  });

  it('refuses a chain without a source and a load', () => {
    const doc = chain([SRC, LOAD], { f0Hz: 1e6 });
    doc.stages = doc.stages.slice(0, 1); // as a mode that leaves stages out can
    const issues = issuesOf(() => buildChain(doc, TEST_CATALOGUE));
    expect(issues.at(-1)?.message).toMatch(/at least a source and a load/);
  });

  it('lays out sections flat, maps nodes, and carries f0 through a mixer', () => {
    const doc = chain(
      [SRC, { type: 't-tank' }, { type: 't-mixer', values: { lo: 1.455e6 } }, { type: 't-tank' }, LOAD], // prettier-ignore
      { f0Hz: 1e6 },
    );
    const built = buildChain(doc, TEST_CATALOGUE);
    expect(built.sections).toHaveLength(3);
    expect(Array.from(built.userNodeFlat)).toEqual([0, 1, 2, 3]);
    expect(Array.from(built.sectionStage)).toEqual([0, 1, 2]);
    // IF = |1000 − 1455| kHz = 455 kHz after the mixer (IMG-1 arithmetic)
    expect(Array.from(built.f0AtFlatNode)).toEqual([1e6, 1e6, 455e3, 455e3]);
  });
});

describe('frequencyGrid', () => {
  it('includes both ends for lin and log spacing', () => {
    expect(Array.from(frequencyGrid({ startHz: 1, stopHz: 5, points: 5, scale: 'lin' }))).toEqual([1, 2, 3, 4, 5]); // prettier-ignore
    const log = frequencyGrid({ startHz: 1e3, stopHz: 1e6, points: 4, scale: 'log' });
    [1e3, 1e4, 1e5, 1e6].forEach((f, i) => expect(log[i] / f).toBeCloseTo(1, 12));
  });

  it('a one-point sweep is the start frequency', () => {
    expect(Array.from(frequencyGrid({ startHz: 7e6, stopHz: 9e6, points: 1, scale: 'log' }))).toEqual([7e6]); // prettier-ignore
  });

  it('refuses a bad sweep with a message that names the field', () => {
    expect(() => frequencyGrid({ startHz: 0, stopHz: 1, points: 3, scale: 'lin' })).toThrow(/start must be/); // prettier-ignore
    expect(() => frequencyGrid({ startHz: 1, stopHz: 2, points: 0, scale: 'lin' })).toThrow(/points must be/); // prettier-ignore
  });
});
