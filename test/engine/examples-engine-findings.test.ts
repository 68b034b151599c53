/**
 * Engine behaviour the example chains run into, written as the expectation the product
 * states, on the examples as they are: the detector flag on a load stage (a regression
 * check), and a sweep point that lands exactly on the local oscillator (IF = 0 Hz), which
 * fails until the IF filter block gives a finite response there.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine';
import { chainDocumentSchema, type ChainDocument } from '../../shared/schema/chain';

const DIR = path.join(__dirname, '..', '..', 'examples');
const docOf = (key: string): ChainDocument => {
  const { variantOf: _v, ...raw } = JSON.parse(readFileSync(path.join(DIR, `${key}.chain.json`), 'utf8')); // prettier-ignore
  return chainDocumentSchema.parse(raw);
};
const keys = readdirSync(DIR)
  .filter((n) => n.endsWith('.chain.json'))
  .map((n) => n.slice(0, -'.chain.json'.length));

describe('detector below its working level (a flag the product lists)', () => {
  // Every envelope detector in the catalogue is a load, the last stage of a chain.
  const withDetector = keys.filter((k) => docOf(k).stages.at(-1)!.type === 'envelope-detector');

  it.each(withDetector)(
    '%s: flagged exactly when the detector input is below its threshold',
    (key) => {
      const doc = docOf(key);
      const detector = doc.stages.at(-1)!;
      const res = analyzeChain(doc, { sweep: false });
      const vIn = res.nodes[res.nodes.length - 1].vPeak;
      const threshold = detector.values.minInputPeakV as number;
      const flags = res.flags.filter((f) => f.code === 'detector-underdriven');
      if (vIn < threshold) {
        expect(flags.map((f) => f.stageId)).toEqual([detector.id]);
        expect(flags[0].data).toMatchObject({ minInputPeakV: threshold });
      } else {
        expect(flags).toEqual([]);
      }
    },
  );

  it('the long-wave loop leaves its detector far below 0.1 V peak, so the flag is due there', () => {
    const res = analyzeChain(docOf('longwave-time-signal-loop'), { sweep: false });
    expect(res.nodes[res.nodes.length - 1].vPeak).toBeLessThan(1e-3);
    expect(res.flags.map((f) => f.code)).toContain('detector-underdriven');
  });
});

describe('a sweep point exactly at the local oscillator (IF = 0 Hz)', () => {
  it('keeps every node finite when the shortwave sweep lands on fLO = 7.655 MHz', () => {
    const doc = docOf('shortwave-superhet-single-tank');
    // 6 to 9 MHz in 6001 points: 500 Hz steps, so point 3310 is exactly f0 + IF.
    const onLo = { ...doc, settings: { ...doc.settings, sweep: { ...doc.settings.sweep, points: 6001 } } }; // prettier-ignore
    const res = analyzeChain(onLo, { sweep: true });
    const i = res.sweep!.freqsHz.indexOf(doc.settings.f0Hz + 455e3);
    expect(i).toBeGreaterThan(0);
    const atLo = res.sweep!.nodes.map((n) => n.stepUpDb[i]);
    expect(atLo.filter((v) => !Number.isFinite(v))).toEqual([]);
  });
});
