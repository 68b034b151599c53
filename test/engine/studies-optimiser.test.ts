/**
 * The optimiser recovers known values from a perturbed start. Closed forms: a lossless tank
 * resonates at 1/(2π√(LC)); between two 5 kΩ ends (R = 2.5 kΩ in parallel) its −3 dB width is
 * 1/(2π·R·C) (parallel RLC, textbook).
 */
import { optimiserSpecSchema } from '../../shared/schema/studies';
import { runOptimiser } from '../../shared/engine/studies';
import { singleTank } from './helpers/study-chains';

const TWO_PI = 2 * Math.PI;

jest.setTimeout(120_000);

describe('optimiser (Levenberg–Marquardt)', () => {
  it('finds the capacitance that resonates a fixed coil at the target', () => {
    const l = 10e-6;
    const cTrue = 100e-12;
    const f0 = 1 / (TWO_PI * Math.sqrt(l * cTrue));
    const doc = singleTank({ l, c: cTrue * 1.3, points: 201 });
    const progress: number[] = [];
    const result = runOptimiser(
      { doc },
      optimiserSpecSchema.parse({
        kind: 'optimiser',
        variables: [{ stageId: 'tank', key: 'c', min: 10e-12, max: 1e-9 }],
        goals: [{ kind: 'resonance', stageId: 'tank', targetHz: f0 }],
      }),
      (p) => progress.push(p.bestCost),
    );
    expect(result.variables[0].after / cTrue).toBeCloseTo(1, 5);
    expect(result.after.cost).toBeLessThan(1e-6);
    expect(result.before.cost).toBeGreaterThan(100);
    expect(progress.length).toBe(result.evaluations);
    // Best cost so far never rises.
    progress.forEach((c, i) => i && expect(c).toBeLessThanOrEqual(progress[i - 1]));
    const tank = result.document.stages.find((s) => s.id === 'tank')!;
    expect(tank.values.c).toBe(result.variables[0].after);
    expect(result.document.settings.sweep.points).toBe(doc.settings.sweep.points);
  });

  it('recovers both L and C from a resonance and a −3 dB width', () => {
    const cTrue = 100e-12;
    const f0 = 10e6;
    const lTrue = 1 / ((TWO_PI * f0) ** 2 * cTrue);
    const bw = 1 / (TWO_PI * 2500 * cTrue);
    const doc = singleTank({ l: lTrue * 1.4, c: cTrue * 0.7, points: 2001, span: 0.3 });
    doc.settings.f0Hz = f0;
    doc.settings.sweep = { startHz: 7e6, stopHz: 13e6, points: 2001, scale: 'lin' };
    const result = runOptimiser(
      { doc },
      optimiserSpecSchema.parse({
        kind: 'optimiser',
        variables: [
          { stageId: 'tank', key: 'l', min: 0.1e-6, max: 100e-6 },
          { stageId: 'tank', key: 'c', min: 10e-12, max: 1e-9 },
        ],
        goals: [
          { kind: 'resonance', stageId: 'tank', targetHz: f0 },
          { kind: 'bandwidth', node: 1, targetHz: bw },
        ],
      }),
    );
    expect(result.variables[0].after / lTrue).toBeCloseTo(1, 3);
    expect(result.variables[1].after / cTrue).toBeCloseTo(1, 3);
    expect(result.after.goals.map((g) => g.value!)).toEqual([
      expect.closeTo(f0, -2),
      expect.closeTo(bw, -2),
    ]);
  });

  it('refuses a variable whose value lies outside its bounds', () => {
    const doc = singleTank({ l: 10e-6, c: 100e-12, points: 51 });
    const spec = optimiserSpecSchema.parse({
      kind: 'optimiser',
      variables: [{ stageId: 'tank', key: 'c', min: 200e-12, max: 1e-9 }],
      goals: [{ kind: 'gain', targetDb: 0 }],
    });
    expect(() => runOptimiser({ doc }, spec)).toThrow(/outside its bounds/);
  });
});
