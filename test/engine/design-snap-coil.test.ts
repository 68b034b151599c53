/**
 * Snapping a chain to a preferred series (IEC 60063) with before/after, and coil turns by
 * Wheeler's formula (H. A. Wheeler, Proc. IRE 16, 1928: L[µH] = d²n²/(18d + 40l), inches).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  coilWinding,
  DEFAULT_COIL_FORM,
  SERIES_MANTISSAS,
  snapChain,
  snapDocument,
  stageParts,
  stagePartsCsv,
  wheelerInductance,
} from '../../shared/engine/design';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { rel } from './stages-support';

const example = (name: string): ChainDocument =>
  parseChainDocument(
    JSON.parse(readFileSync(join(__dirname, '../../examples', `${name}.chain.json`), 'utf8')),
  );

describe('E48', () => {
  it('is every second E96 value, 48 to the decade (IEC 60063 E48 table; from memory)', () => {
    expect(SERIES_MANTISSAS.E48).toHaveLength(48);
    expect(SERIES_MANTISSAS.E48).toEqual(SERIES_MANTISSAS.E96.filter((_, i) => i % 2 === 0));
    expect(SERIES_MANTISSAS.E48.slice(0, 8)).toEqual([1.0, 1.05, 1.1, 1.15, 1.21, 1.27, 1.33, 1.4]);
  });
});

describe('snap a chain', () => {
  const single = example('shortwave-superhet-single-tank');

  it('snaps the tank’s parts to E12 by the nearest-ratio rule and leaves device models alone', () => {
    const { document, changes } = snapDocument(single, { series: 'E12' });
    const tank = document.stages.find((s) => s.id === 'preselector')!;
    // 222.1 pF: 220 (ln ratio 0.0095) is nearer than 270; 2.2 µH is already E12.
    expect(tank.values.c).toBe(220e-12);
    expect(tank.values.l).toBe(2.2e-6);
    expect(changes.map((c) => `${c.stageId}.${c.key}`)).toContain('preselector.c');
    // The amplifier's input resistance is a device property, not a part to buy.
    expect(changes.some((c) => c.stageId === 'rf-amp')).toBe(false);
    // The typed text no longer describes the snapped capacitor.
    expect((tank.entered as Record<string, string>).c).toBeUndefined();
    expect(single.stages.find((s) => s.id === 'preselector')!.values.c).toBe(2.221e-10);
  });

  it('reports the resonance shift Thomson’s formula predicts, and before/after figures', () => {
    const r = snapChain(single, { series: 'E12', stageId: 'preselector' });
    const tank = r.resonators.find((x) => x.label === 'tank')!;
    // f ∝ 1/√C (common practice): 222.1 → 220 pF raises f0 by √(222.1/220) − 1 = 0.476 %.
    const predicted = tank.beforeHz! * (Math.sqrt(222.1 / 220) - 1);
    expect(rel(tank.shiftHz!, predicted)).toBeLessThan(0.02);
    expect(r.response.beforeDb.length).toBe(r.response.freqsHz.length);
    expect(r.response.afterDb).not.toEqual(r.response.beforeDb);
    expect(Number.isFinite(r.after.totalGainDb - r.before.totalGainDb)).toBe(true);
    expect(r.rule).toMatch(/nearest/);
  });
});

describe('coil turns (Wheeler)', () => {
  it('recovers the turns of a 1 in × 1 in, 10-turn coil: 100/58 µH = 1.724 µH', () => {
    const l = wheelerInductance(10, 0.0254, 0.0254);
    expect(rel(l, (100 / 58) * 1e-6)).toBeLessThan(1e-12);
    const w = coilWinding(l, { formerDiameterM: 0.0254, lengthM: 0.0254 });
    expect(w.turns).toBeCloseTo(10, 9);
    expect(w.withinAccuracy).toBe(true);
  });

  it('solves the quadratic for wire and pitch: the winding gives back the inductance', () => {
    const form = { formerDiameterM: 0.02, wireDiameterM: 0.0005, pitchM: 0.001 };
    const w = coilWinding(2.2e-6, form);
    const back = wheelerInductance(w.turns, 0.0205, w.turns * 0.001);
    expect(rel(back, 2.2e-6)).toBeLessThan(1e-12);
    expect(w.coilDiameterM).toBeCloseTo(0.0205, 12);
    expect(() => coilWinding(1e-6, { ...form, pitchM: 0.0001 })).toThrow(/pitch/);
  });

  it('lists a stage’s parts with turns beside the inductor, and exports them', () => {
    const tank = example('shortwave-superhet-single-tank').stages.find(
      (s) => s.id === 'preselector',
    )!;
    const rows = stageParts(tank, DEFAULT_COIL_FORM);
    const coil = rows.find((r) => r.key === 'l')!;
    expect(coil.winding!.roundedTurns).toBeGreaterThan(1);
    expect(rows.find((r) => r.key === 'c')!.winding).toBeNull();
    const csv = stagePartsCsv(tank, rows, DEFAULT_COIL_FORM);
    expect(csv).toContain('Wheeler');
    expect(csv.split('\n')[2]).toMatch(/^Inductance,2\.200e-6,H,,10\.25,/);
  });
});
