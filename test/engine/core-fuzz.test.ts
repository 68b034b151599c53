/**
 * Robustness: any chain built from the test stages with arbitrary values either analyses
 * or fails with a ChainValidationError naming what to fix; it never crashes.
 */
import fc from 'fast-check';
import { analyzeChain } from '../../shared/engine/analyze';
import { ChainValidationError } from '../../shared/engine/errors';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const value = fc.oneof(
  fc.double({ min: -1e6, max: 1e6 }),
  fc.constantFrom(NaN, Infinity, -Infinity, 0, 1e-12, 'text', true),
);
const twoPorts = TEST_CATALOGUE.filter((d) => d.role === 'two-port');

describe('arbitrary chains', () => {
  it('property: analyses or refuses with issues that name a path and say what to fix', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            def: fc.constantFrom(...twoPorts),
            values: fc.dictionary(fc.constantFrom('r', 'l', 'c', 'rs', 'gm', 'lo', 'rin'), value),
          }),
          { maxLength: 4 },
        ),
        fc.double({ min: 1e3, max: 1e8, noNaN: true }),
        (stages, f0) => {
          const doc = chain(
            [{ type: 't-source' }, ...stages.map((s) => ({ type: s.def.type })), { type: 't-load' }], // prettier-ignore
            { f0Hz: f0 },
          );
          // Set after the parse: the values include NaN and ±Infinity, which JSON cannot
          // carry and the schema refuses, and the engine must still name.
          stages.forEach((s, i) => (doc.stages[i + 1].values = s.values));
          doc.settings.sweep = { startHz: f0 / 2, stopHz: f0 * 2, points: 41, scale: 'log' };
          try {
            const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
            expect(res.nodes).toHaveLength(stages.length + 1);
          } catch (e) {
            expect(e).toBeInstanceOf(ChainValidationError);
            for (const issue of (e as ChainValidationError).issues) {
              expect(issue.path.length).toBeGreaterThan(0);
              expect(issue.message).toMatch(/^Stage \d+ ".*" \(t-[a-z-]+\): .+/);
            }
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});
