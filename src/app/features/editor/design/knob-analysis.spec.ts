/**
 * @jest-environment node
 */
// The knob's analysis runs in a Web Worker, with no DOM; zod needs structuredClone, which
// jsdom lacks.
import { chainDocumentSchema, type ChainDocument } from '../../../../../shared/schema/chain';
import { knobAnswer } from './knob-analysis';
import type { KnobAnswer } from './knob-messages';
import { tunedChain } from './tuned-chain';

const L = 100e-6;
const C = 253.3e-12;
const R = 5000;

/**
 * A lossless parallel tank between a 5 kΩ generator and a 5 kΩ load: it peaks at
 * f0 = 1/(2π√(LC)), its −3 dB width is 1/(2π·R∥R·C), and at f0 the load sees half the EMF
 * (−6.02 dB). A "low" mode doubles the capacitor, moving the peak down by √2.
 */
function tankChain(): ChainDocument {
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  return chainDocumentSchema.parse({
    name: 'Tank for the knob',
    settings: { f0Hz: f0, sweep: { startHz: 0.6 * f0, stopHz: 1.4 * f0, points: 2001 } },
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: R, level: 'power', powerDbm: -60 } },
      {
        id: 'tank',
        type: 'shunt-lc-tank',
        label: 'Preselector',
        values: { l: L, ql: 1e12, c: C, qc: 1e12 },
      },
      { id: 'load', type: 'rc-load', values: { r: R, c: 0 } },
    ],
    modes: [
      { id: 'high', name: 'High band', values: {} },
      { id: 'low', name: 'Low band', values: { tank: { c: 2 * C } }, settings: { f0Hz: f0 / Math.SQRT2 } }, // prettier-ignore
    ],
  });
}

function live(answer: KnobAnswer): Extract<KnobAnswer, { ok: true }> {
  if (!answer.ok) throw new Error(`expected live figures, got: ${answer.message}`);
  return answer;
}

describe('knob-analysis', () => {
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  const bw = 1 / (2 * Math.PI * (R / 2) * C);

  it('should give the peak, the −3 dB width and the step-up at f0 of the chain being tuned', () => {
    const a = live(knobAnswer({ id: 7, ...tunedChain(tankChain(), null, 'tank', 'c', C) }));
    expect(a.id).toBe(7);
    // The live grid has 401 points over ±40 %: the peak is within one step of f0.
    expect(Math.abs(a.peakHz! - f0)).toBeLessThan((0.8 * f0) / 400);
    expect(a.bw3dbHz! / bw).toBeCloseTo(1, 2);
    expect(a.stepUpAtF0Db).toBeCloseTo(20 * Math.log10(0.5), 3);
    expect(a.freqsHz).toHaveLength(401);
    // Figures for the main results panel too: one line a two-port stage.
    expect(a.live.stages.map((s) => s.id)).toEqual(['tank']);
  });

  it('should follow the value as it turns', () => {
    const a = live(knobAnswer({ id: 1, ...tunedChain(tankChain(), null, 'tank', 'c', 1.21 * C) }));
    // f ∝ 1/√C: a capacitor 21 % larger tunes 1/1.1 lower.
    expect(Math.abs(a.peakHz! - f0 / 1.1)).toBeLessThan((0.8 * f0) / 400);
  });

  it('should analyse the chain while its name is cleared: the engine does not read it', () => {
    const doc = { ...tankChain(), name: '   ', description: 'x'.repeat(6000) };
    const a = live(knobAnswer({ id: 2, ...tunedChain(doc, null, 'tank', 'c', C) }));
    expect(a.stepUpAtF0Db).toBeCloseTo(20 * Math.log10(0.5), 3);
  });

  it("should analyse the mode on screen, with the turning value as that mode's own", () => {
    const doc = tankChain();
    const low = doc.modes![1];
    const question = tunedChain(doc, low, 'tank', 'c', 2 * C);
    expect(question.mode).toBe('low');
    // The chain's own value is left as it is; the mode's override turns.
    expect(question.document.stages[1].values['c']).toBe(C);
    const a = live(knobAnswer({ id: 3, ...question }));
    expect(Math.abs(a.peakHz! - f0 / Math.SQRT2)).toBeLessThan((0.8 * f0) / 400);
    // The mode's own design frequency: at f0/√2 the tank is resonant, the load sees EMF/2.
    expect(a.stepUpAtF0Db).toBeCloseTo(20 * Math.log10(0.5), 3);
  });

  it('should name the stage and the field the schema refuses', () => {
    const doc = tankChain();
    const values = { ...doc.stages[1].values, l: {} as unknown as number };
    doc.stages[1] = { ...doc.stages[1], values };
    const a = knobAnswer({ id: 4, ...tunedChain(doc, null, 'tank', 'c', C) });
    expect(a.ok).toBe(false);
    expect(a.ok ? '' : a.message).toContain('stage 2 "Preselector", values.l: ');
  });

  it("should pass on the builder's refusal, which names the stage and the parameter", () => {
    const doc = tankChain();
    doc.stages[1] = { ...doc.stages[1], values: { ...doc.stages[1].values, l: 'lots' } };
    const a = knobAnswer({ id: 4, ...tunedChain(doc, null, 'tank', 'c', C) });
    expect(a.ok).toBe(false);
    expect(a.ok ? '' : a.message).toMatch(/Stage 2 "Preselector".*inductance/);
  });

  it('should name the setting when the sweep cannot be drawn', () => {
    const doc = tankChain();
    const bad = {
      ...doc,
      settings: { ...doc.settings, sweep: { ...doc.settings.sweep, points: 0 } },
    };
    const a = knobAnswer({ id: 5, document: bad });
    expect(a.ok).toBe(false);
    expect(a.ok ? '' : a.message).toContain('$.settings.sweep.points');
  });
});
