/**
 * Every finite value inside the ranges gives an answer of numbers or a refusal that names
 * what to fix: a lossy line whose √f loss would overflow is refused by its loss parameter,
 * and any figure lost to NaN at the end of an analysis refuses the chain, naming the stage.
 */
import { analyzeChain, ChainValidationError } from '../../shared/engine';
import { MAX_LINE_LOSS_DB } from '../../shared/engine/stages/elements';
import type { StageDefinition } from '../../shared/engine/types';
import { chain, TEST_CATALOGUE } from './core-fixtures';
import { parseChainDocument } from '../../shared/schema/parse-chain';

/** A 50 Ω generator, a line, a 50 Ω load at f0, swept f0/2 … 2·f0. */
const lineChain = (f0: number, line: Record<string, number>) =>
  parseChainDocument({
    name: 'line',
    settings: { f0Hz: f0, sweep: { startHz: f0 / 2, stopHz: 2 * f0, points: 21, scale: 'log' as const } }, // prettier-ignore
    stages: [
      { id: 'g', type: 'resistive-generator', values: { r: 50 } },
      { id: 'line', type: 'transmission-line', label: 'Feeder', values: { z0: 50, vf: 0.66, ...line } }, // prettier-ignore
      { id: 'l', type: 'rc-load', values: { r: 50 } },
    ],
  });

function refusal(run: () => unknown): ChainValidationError {
  try {
    run();
  } catch (e) {
    if (e instanceof ChainValidationError) return e;
    throw e;
  }
  throw new Error('the chain was analysed, not refused');
}

describe('lossy lines', () => {
  it('300 dB/m stated at 1 Hz is refused by its loss, with the loss it would reach', () => {
    // 300 dB/m × √(4 MHz / 1 Hz) × 1 m = 600,000 dB at the top of the evaluated range.
    const e = refusal(() => analyzeChain(lineChain(1e6, { length: 1, lossDbPerM: 300, refHz: 1 }))); // prettier-ignore
    expect(e.issues).toHaveLength(1);
    expect(e.issues[0]).toMatchObject({ stageId: 'line', param: 'lossDbPerM' });
    expect(e.issues[0].message).toMatch(
      /^Stage 2 "Feeder" \(transmission-line\): the line would lose 600000 dB at 4 MHz .*more than the 1000 dB the analysis takes; check the loss per metre and its reference frequency/,
    );
  });

  it('a line just inside the limit analyses to finite figures', () => {
    // 990 dB at the top of the range (4·f0 = 4 MHz, referred to 4 MHz): 300 dB/m × 3.3 m.
    const length = (MAX_LINE_LOSS_DB * 0.99) / 300;
    const res = analyzeChain(lineChain(1e6, { length, lossDbPerM: 300, refHz: 4e6 }));
    for (const n of res.nodes) expect(Number.isFinite(n.stepUpDb)).toBe(true);
  });

  it('a matched lossy line loses α·l: 0.2 dB/m at 100 MHz over 10 m is 4 dB at 400 MHz', () => {
    // Matched line: transducer loss = α(f)·l with α ∝ √f (conductor loss, common practice).
    const res = analyzeChain(lineChain(400e6, { length: 10, lossDbPerM: 0.2, refHz: 100e6 }));
    expect(res.nodes[1].transducerGainDb).toBeCloseTo(-4, 9);
  });
});

describe('a lost figure refuses the chain', () => {
  // A two-port whose ABCD overflows: every impedance through it is ∞/∞ = NaN.
  const OVERFLOW: StageDefinition = {
    type: 't-overflow',
    category: 'element',
    role: 'two-port',
    label: 'Overflowing section',
    summary: 'Test only.',
    params: [],
    build: () => ({
      sections: [{ abcd: (_f, out, o) => out.fill(Infinity, o, o + 8) }],
      noise: { kind: 'passive' },
    }),
  };

  it('names the stage whose output figures are lost, instead of answering with NaN', () => {
    const doc = chain(
      [{ type: 't-source' }, { type: 't-overflow', label: 'Bad' }, { type: 't-load' }],
      { f0Hz: 1e6 },
    );
    const e = refusal(() => analyzeChain(doc, { catalogue: [...TEST_CATALOGUE, OVERFLOW] }));
    expect(e.issues[0]).toMatchObject({ stageId: 's1', path: ['stages', 1] });
    expect(e.issues[0].message).toMatch(
      /^Stage 2 "Bad" \(t-overflow\): the analysis loses the impedance at its input \(node 0\) at f0 \(not a number\)/,
    );
  });

  it('an open load (infinite impedance, nothing delivered) is an answer, not a loss', () => {
    const doc = chain([{ type: 't-source' }, { type: 't-load', values: { mode: 'open' } }], {
      f0Hz: 1e6,
    });
    const res = analyzeChain(doc, { catalogue: TEST_CATALOGUE });
    expect(res.nodes[0].zIn.re).toBe(Infinity);
    expect(res.nodes[0].stepUp).toBe(1);
  });
});
