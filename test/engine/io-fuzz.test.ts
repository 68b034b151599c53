/**
 * Fuzzing the readers of files users bring (fast-check, fixed seeds, 10,000 inputs each):
 * random text and mutations of valid files. Each input either parses into data that holds
 * the reader's promises, or is refused with the reader's own error naming a line (or, for
 * a chain file's fields, a JSON path). Never another exception, never a hang (each run is
 * a single pass over the text).
 */
import fc from 'fast-check';
import { readTouchstone, TouchstoneError } from '../../shared/io/touchstone';
import { ChainFileError, readChainFile } from '../../shared/io/chain-file';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { PartsCsvError, readPartsCsv } from '../../shared/io/parts-csv';

const RUNS = 10_000;
const TIMEOUT_MS = 240_000;

/** Mutations of a valid text: cut a span, insert a fragment, duplicate or drop a line. */
function mutationsOf(valid: string[], fragments: fc.Arbitrary<string>): fc.Arbitrary<string> {
  const one = (text: string) =>
    fc.oneof(
      fc
        .tuple(fc.nat({ max: text.length }), fc.nat({ max: 30 }))
        .map(([at, cut]) => text.slice(0, at) + text.slice(at + cut)),
      fc
        .tuple(fc.nat({ max: text.length }), fragments)
        .map(([at, ins]) => text.slice(0, at) + ins + text.slice(at)),
      fc.nat().map((k) => {
        const lines = text.split('\n');
        const i = k % lines.length;
        return [...lines.slice(0, i + 1), lines[i], ...lines.slice(i + 1)].join('\n');
      }),
      fc.nat().map((k) => {
        const lines = text.split('\n');
        lines.splice(k % lines.length, 1);
        return lines.join('\n');
      }),
    );
  return fc
    .constantFrom(...valid)
    .chain((t) => one(t).chain((t2) => fc.oneof(fc.constant(t2), one(t2))));
}

const lineCount = (text: string) => text.split(/\r\n|\r|\n/).length;

describe('Touchstone reader fuzz', () => {
  const VALID = [
    '# MHz S MA R 50\n1 0.5 -30\n2 0.4 -60\n',
    '! amp\n# GHz S DB R 50\n1 -10 30 12 80 -30 10 -12 -40\n2 -11 20 11 70 -31 5 -13 -50\n' +
      '1 0.8 0.4 60 0.3\n2 1.0 0.35 70 0.32\n',
    '[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n[Two-Port Data Order] 12_21\n' +
      '[Number of Frequencies] 2\n[Number of Noise Frequencies] 1\n[Reference]\n50\n75\n' +
      '[Network Data]\n1e6 0.1 0 0.2 0 0.3 0 0.4 0\n2e6 0.1 0.01\n 0.2 0.02 0.3 0.03 0.4 0.04\n' +
      '[Noise Data]\n1e6 1.1 0.3 45 20\n[End]\n',
    '[Version] 2.0\n# kHz Z RI R 50\n[Number of Ports] 1\n[Network Data]\n10 20 30\n20 25 -5\n[End]\n',
    '# Hz Y RI R 75 75\n1 0.1 0.2 0.3 0.4 0.5 0.6 0.7 0.8\n',
  ];
  const TOKENS = [
    '#', '!', '[', ']', 'MHz', 'GHz', 'S', 'Y', 'Z', 'DB', 'MA', 'RI', 'R', '50', '0', '-1',
    '1e400', 'NaN', 'Infinity', '0.5', '12_21', '21_12', '[Version] 2.0', '[Number of Ports] 2',
    '[Number of Ports] 1', '[Two-Port Data Order] 12_21', '[Reference] 50 25', '[Reference]',
    '[Network Data]', '[Noise Data]', '[Number of Frequencies] 2', '[Number of Noise Frequencies] 1',
    '[Matrix Format] Lower', '[Begin Information]', '[End Information]', '[End]', '\n', ' ', '\t',
  ]; // prettier-ignore
  const fragment = fc.oneof(
    fc.constantFrom(...TOKENS),
    fc.string({ maxLength: 6 }),
    fc.double().map(String),
  );
  const randomLines = fc
    .array(fc.array(fragment, { maxLength: 10 }), { maxLength: 20 })
    .map((lines) => lines.map((l) => l.join(' ')).join('\n'));
  const input = fc.tuple(
    fc.oneof(mutationsOf(VALID, fragment), randomLines, fc.string({ maxLength: 200 })),
    fc.constantFrom('fuzz.s1p', 'fuzz.s2p', 'fuzz.ts'),
  );

  it(
    `parses correctly or refuses with a line number, for ${RUNS} inputs (seed 2026)`,
    () => {
      let parsed = 0;
      fc.assert(
        fc.property(input, ([text, name]) => {
          let file;
          try {
            file = readTouchstone(text, name);
          } catch (err) {
            expect(err).toBeInstanceOf(TouchstoneError);
            const line = (err as TouchstoneError).line;
            expect(Number.isInteger(line)).toBe(true);
            expect(line).toBeGreaterThanOrEqual(1);
            expect(line).toBeLessThanOrEqual(lineCount(text));
            expect((err as Error).message).toContain(`${name}, line ${line}: `);
            return;
          }
          parsed++;
          const stride = file.ports === 1 ? 2 : 8;
          expect(file.freqsHz.length).toBeGreaterThan(0);
          expect(file.s.length).toBe(stride * file.freqsHz.length);
          expect(file.s.every(Number.isFinite)).toBe(true);
          expect(file.z0).toBeGreaterThan(0);
          for (let i = 1; i < file.freqsHz.length; i++) {
            expect(file.freqsHz[i]).toBeGreaterThan(file.freqsHz[i - 1]);
          }
          for (const n of file.noise) {
            expect([n.fHz, n.nfMinDb, n.gammaOpt.re, n.gammaOpt.im, n.rnOhm].every(Number.isFinite)).toBe(true); // prettier-ignore
          }
        }),
        { seed: 2026, numRuns: RUNS },
      );
      // The mutations keep a fair share of files readable, so the parse side is exercised.
      expect(parsed).toBeGreaterThan(RUNS / 20);
    },
    TIMEOUT_MS,
  );
});

describe('chain file reader fuzz', () => {
  const valid = JSON.stringify(
    chainDocumentSchema.parse({
      name: 'Fuzz tank',
      settings: {
        f0Hz: 1e6,
        sweep: { startHz: 5e5, stopHz: 2e6, points: 21, scale: 'log' },
      },
      stages: [
        { id: 'src', type: 'resistive-generator', values: {} },
        { id: 'tank', type: 'shunt-lc-tank', values: { l: 2.2e-5, c: 1.1e-9 } },
        { id: 'load', type: 'rc-load', values: {} },
      ],
    }),
    null,
    2,
  );
  const fragment = fc.oneof(
    fc.constantFrom(
      '{',
      '}',
      '[',
      ']',
      ',',
      ':',
      '"',
      '\\',
      'null',
      '2',
      '"formatVersion": 2',
      '\n',
    ),
    fc.string({ maxLength: 5 }),
  );
  const input = fc.oneof(
    mutationsOf([valid], fragment),
    fc.json({ maxDepth: 4 }),
    fc.string({ maxLength: 120 }),
    fc.nat({ max: 200 }).map((d) => '['.repeat(d * 50)),
  );

  it(
    `reads a valid document or refuses with a line or JSON path, for ${RUNS} inputs (seed 7)`,
    () => {
      let parsed = 0;
      fc.assert(
        fc.property(input, (text) => {
          let doc;
          try {
            doc = readChainFile(text, 'fuzz.chain.json');
          } catch (err) {
            expect(err).toBeInstanceOf(ChainFileError);
            const { line, column, path } = (err as ChainFileError).where;
            if (path === undefined) {
              expect(line).toBeGreaterThanOrEqual(1);
              expect(line).toBeLessThanOrEqual(lineCount(text));
              expect(column).toBeGreaterThanOrEqual(1);
              expect((err as Error).message).toContain(`line ${line}, column ${column}`);
            } else {
              expect(path.startsWith('$')).toBe(true);
              expect((err as Error).message).toContain(path);
            }
            return;
          }
          parsed++;
          expect(chainDocumentSchema.parse(doc)).toEqual(doc);
        }),
        { seed: 7, numRuns: RUNS },
      );
      expect(parsed).toBeGreaterThan(RUNS / 50);
    },
    TIMEOUT_MS,
  );

  it('points at the line and column where the JSON goes wrong', () => {
    const broken = '{\n  "format": "chainwright-chain",\n  "stages": [,\n}';
    const err = (() => {
      try {
        readChainFile(broken, 'x.chain.json');
      } catch (e) {
        return e as ChainFileError;
      }
      throw new Error('expected a refusal');
    })();
    expect(err.where).toEqual({ line: 3, column: 14 });
  });
});

describe('parts CSV reader fuzz', () => {
  const VALID = [
    'Part number,Kind,Value,Q,Q at,Tolerance %,Notes\n' +
      'L-22U,inductor,22 uH,80,1 MHz,10,shielded\nC-100P,capacitor,100 pF,500,10 MHz,5,C0G\n',
    'value;type;q;q_freq;tol\n4.7uH;L;60;7MHz;5\n330p;C;1000;7MHz;2\n',
  ];
  const fragment = fc.oneof(
    fc.constantFrom(
      ',',
      ';',
      '"',
      '\n',
      '\r\n',
      'uH',
      'pF',
      'k',
      'MHz',
      '%',
      '-',
      '1e999',
      'L',
      'C',
    ),
    fc.string({ maxLength: 6 }),
  );
  const input = fc.oneof(mutationsOf(VALID, fragment), fc.string({ maxLength: 200 }));

  it(
    `reads parts or refuses with a line number, for ${RUNS} inputs (seed 99)`,
    () => {
      let parsed = 0;
      fc.assert(
        fc.property(input, (text) => {
          let parts;
          try {
            parts = readPartsCsv(text).parts;
          } catch (err) {
            expect(err).toBeInstanceOf(PartsCsvError);
            const line = (err as PartsCsvError).line;
            expect(line).toBeGreaterThanOrEqual(1);
            expect((err as Error).message).toMatch(/^line \d+/);
            return;
          }
          parsed++;
          for (const p of parts) {
            expect(['inductor', 'capacitor']).toContain(p.kind);
            expect(p.value).toBeGreaterThan(0);
            expect(Number.isFinite(p.value)).toBe(true);
            if (p.q !== undefined) expect(p.q).toBeGreaterThan(0);
            if (p.tolerancePct !== undefined) expect(p.tolerancePct).toBeGreaterThanOrEqual(0);
          }
        }),
        { seed: 99, numRuns: RUNS },
      );
      expect(parsed).toBeGreaterThan(RUNS / 50);
    },
    TIMEOUT_MS,
  );
});
