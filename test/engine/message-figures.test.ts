/**
 * The significant figures of the engine's sentences: 3 unless the caller asks for others,
 * and only for the call that asked.
 */
import { analyzeChain } from '../../shared/engine/analyze';
import { formatNumber, withMessageFigures } from '../../shared/engine/core/format';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';

// A 1 mH loop tank at 77.5 kHz overloaded by a 10 kΩ detector (as in core-flags.test.ts).
const f0 = 77.5e3;
const l = 1e-3;
const c = 1 / ((2 * Math.PI * f0) ** 2 * l);
const stages: StageInput[] = [
  { type: 't-source', values: { rs: 100e3 } },
  { type: 't-tank', label: 'Loop tank', values: { l, c, rs: 1.62 } },
  { type: 't-shunt-r', label: 'Envelope detector', values: { r: 10e3 } },
  { type: 't-load', values: { mode: 'open' } },
];
const run = (figures?: number) =>
  analyzeChain(chain(stages, { f0Hz: f0 }), {
    catalogue: TEST_CATALOGUE,
    sweep: false,
    ...(figures === undefined ? {} : { figures }),
  });
/** The Q change as the sentence should write it, from the result's own numbers. */
const qChange = (detachedQ: number, loadedQ: number, digits: number) =>
  `Q falls from ${Number(detachedQ.toPrecision(digits))} to ${Number(loadedQ.toPrecision(digits))} `;

describe('figures of the flag sentences', () => {
  it('writes the loading sentence to 3 figures by default and to 5 when asked', () => {
    const plain = run();
    const r = plain.resonators[0];
    const detachedQ = r.detachedQ as number;
    const loadedQ = r.loadedQ as number;
    // The fixture's Qs need more than 3 figures, so the two wordings really differ.
    expect(qChange(detachedQ, loadedQ, 3)).not.toBe(qChange(detachedQ, loadedQ, 5));
    const flagOf = (res: typeof plain) => res.flags.find((f) => f.code === 'tank-overloaded')!;
    expect(flagOf(plain).message).toContain(qChange(detachedQ, loadedQ, 3));
    const five = run(5);
    expect(five.resonators[0].loadedQ).toBe(loadedQ); // the figures change only the wording
    expect(flagOf(five).message).toContain(qChange(detachedQ, loadedQ, 5));
    // A rule's own precision (its two-decimal ratio) stays as it is.
    expect(flagOf(five).message).toContain('Rule: a ratio below 0.5 (as shown, to two decimals)');
  });

  it('goes back to 3 figures after the call, also after a refusal', () => {
    run(6);
    expect(formatNumber(Math.PI)).toBe('3.14');
    expect(() =>
      withMessageFigures(7, () => {
        expect(formatNumber(Math.PI)).toBe('3.141593');
        throw new Error('refused');
      }),
    ).toThrow('refused');
    expect(formatNumber(Math.PI)).toBe('3.14');
  });
});
