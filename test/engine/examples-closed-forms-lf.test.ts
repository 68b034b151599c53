/**
 * The long-wave and medium-wave examples against closed forms written here (the values read
 * from the example files, so an edited example is checked, not a copied number). The
 * element models and their references are in helpers/closed-forms.ts.
 */
import type { ChainDocument, StageInstance } from '../../shared/schema/chain';
import {
  example,
  stageOf,
  num,
  resonator,
  nodeAfter,
  flagsOf,
  rel,
  type Cx,
  cx,
  add,
  mul,
  inv,
  div,
  abs,
  db20,
  w,
  zCoil,
  yCap,
  zCap,
  yRc,
  coilParallel,
  root,
} from './helpers/closed-forms';

describe('longwave-time-signal-loop: a detector straight across the loop tank', () => {
  const { doc, res } = example('longwave-time-signal-loop');
  const light = example('longwave-time-signal-loop-light-load');
  const tank = stageOf(doc, 'loop-tank');
  const [l, ql, c, qc] = ['l', 'ql', 'c', 'qc'].map((k) => num(tank, k));
  const rN = num(stageOf(doc, 'loop'), 'r');
  const det = (d: ChainDocument) => stageOf(d, 'detector');

  /** Loaded Q and resonance of the tank with the detector (rLoad, cDet) or without it. */
  function closedForm(rLoad: number | null, cDet: number) {
    // fr: B = ωC − 1/(ωLp) = 0 exactly, since Lp of a constant-Q coil does not vary with f
    const lp = coilParallel(1, l, ql).lp;
    const fr = 1 / (2 * Math.PI * Math.sqrt(lp * (c + cDet)));
    const { rp } = coilParallel(fr, l, ql);
    const rCap = qc / (w(fr) * c);
    // detector input resistance ≈ R_load / 2 (common practice; the catalogue's model)
    const g = 1 / rp + 1 / rCap + 1 / rN + (rLoad === null ? 0 : 2 / rLoad);
    return { fr, q: 1 / g / (w(fr) * lp), g };
  }

  it('resonates at 1/(2π√(LC)) with L, C and the detector capacitance, within its bandwidth of f0', () => {
    const cf = closedForm(num(det(doc), 'rLoad'), num(det(doc), 'c'));
    const r = resonator(res, 'loop-tank');
    expect(rel(r.resonanceHz, cf.fr)).toBeLessThan(1e-6);
    expect(Math.abs(r.resonanceHz! - doc.settings.f0Hz)).toBeLessThan(r.bandwidthHz! / 2);
  });

  it('has the loaded Q of coil ∥ capacitor ∥ 10 MΩ ∥ R_load/2, about 4.5, and about 106 detached', () => {
    const att = closedForm(num(det(doc), 'rLoad'), num(det(doc), 'c'));
    const off = closedForm(null, 0);
    const r = resonator(res, 'loop-tank');
    expect(rel(r.loadedQ, att.q)).toBeLessThan(1e-4);
    expect(rel(r.detachedQ, off.q)).toBeLessThan(1e-4);
    expect(rel(r.loadingRatio, att.q / off.q)).toBeLessThan(2e-4);
    expect(att.q).toBeGreaterThan(3);
    expect(att.q).toBeLessThan(6);
    // share of the damping the detector takes: G_det / G_total
    expect(r.downstreamShare!).toBeCloseTo(2 / num(det(doc), 'rLoad') / att.g, 3);
  });

  it('flags the tank as overloaded (error: ratio below 0.2) and states the bandwidths', () => {
    const [flag] = flagsOf(res, 'tank-overloaded');
    expect(flag).toMatchObject({ severity: 'error', stageId: 'loop-tank' });
    expect(flag.data!.loadingRatio as number).toBeLessThan(doc.settings.thresholds.loadingError);
    // −3 dB bandwidth of a parallel RLC is f0/Q (LQ-3); the sweep shows it at the tank node
    const r = resonator(res, 'loop-tank');
    const sel = res.selectivity[nodeAfter(doc, 'loop-tank')];
    expect(rel(sel.bw3dbHz, r.resonanceHz! / r.loadedQ!)).toBeLessThan(0.02);
  });

  it('puts the Norton current through the node impedance: V = (Es/R_N)·|Z| at f0', () => {
    const f0 = doc.settings.f0Hz;
    const es = num(stageOf(doc, 'loop'), 'emf');
    const y = add(
      inv(zCoil(f0, l, ql)),
      yCap(f0, c, qc),
      cx(1 / rN),
      yRc(f0, num(det(doc), 'rLoad') / 2, num(det(doc), 'c')),
    );
    expect(rel(res.nodes[1].vPeak, (es / rN) * abs(inv(y)))).toBeLessThan(1e-6);
  });

  it('light-load variant: a 470 kΩ detector load keeps the ratio above 0.5 and clears the flag', () => {
    const d = light.doc;
    const att = closedForm(num(det(d), 'rLoad'), num(det(d), 'c'));
    const off = closedForm(null, 0);
    const r = resonator(light.res, 'loop-tank');
    expect(rel(r.loadedQ, att.q)).toBeLessThan(1e-4);
    expect(att.q / off.q).toBeGreaterThan(d.settings.thresholds.loadingWarn);
    expect(flagsOf(light.res, 'tank-overloaded')).toEqual([]);
    expect(r.loadedQ!).toBeGreaterThan(10 * resonator(res, 'loop-tank').loadedQ!);
    const sel = light.res.selectivity[nodeAfter(d, 'loop-tank')];
    expect(rel(sel.bw3dbHz, r.resonanceHz! / r.loadedQ!)).toBeLessThan(0.01);
  });
});

// ---------------------------------------------------------------- medium wave

describe('am-broadcast-triode-trf: aerial tank, triode, plate tank, detector', () => {
  const { doc, res } = example('am-broadcast-triode-trf');
  const f0 = doc.settings.f0Hz;
  const ant = stageOf(doc, 'antenna');
  const trim = stageOf(doc, 'antenna-trimmer');
  const t1 = stageOf(doc, 'aerial-tank');
  const tri = stageOf(doc, 'triode');
  const t2 = stageOf(doc, 'plate-tank');
  const det = stageOf(doc, 'detector');
  const [h, d] = [num(ant, 'height'), num(ant, 'diameter')];
  // short monopole: C = 2πε0·h/(ln(2h/d) − 1); R = 40π²(h/λ)² (ANT-2) plus its loss resistance
  const cAnt = (2 * Math.PI * 8.8541878128e-12 * h) / (Math.log((2 * h) / d) - 1);
  const zAnt = (f: number) =>
    cx(40 * Math.PI ** 2 * ((h * f) / 299792458) ** 2 + num(ant, 'lossR'), -1 / (w(f) * cAnt));
  const zBranch = (f: number) => add(zAnt(f), zCap(f, num(trim, 'c'), num(trim, 'qc')));
  const yTank = (s: StageInstance, f: number) =>
    add(inv(zCoil(f, num(s, 'l'), num(s, 'ql'))), yCap(f, num(s, 'c'), num(s, 'qc')));
  const yGrid = (f: number) => yRc(f, num(tri, 'rin'), num(tri, 'cin'));
  const yAerial = (f: number) => add(inv(zBranch(f)), yTank(t1, f), yGrid(f));
  const yPlate = (f: number, withDetector: boolean) =>
    add(
      yRc(f, num(tri, 'rout'), num(tri, 'cout')),
      yTank(t2, f),
      withDetector ? yRc(f, num(det, 'rLoad') / 2, num(det, 'c')) : cx(0),
    );
  /** Loaded Q of a node whose loads are R ∥ C: Q = R∥/(ω·Lp) = ωC/G (LQ-3), at B = 0. */
  const nodeQ = (y: (f: number) => Cx, s: StageInstance) => {
    const fr = root((f) => y(f).im, 0.7 * f0, 1.3 * f0);
    return { fr, q: 1 / y(fr).re / (w(fr) * coilParallel(fr, num(s, 'l'), num(s, 'ql')).lp), g: y(fr).re }; // prettier-ignore
  };

  it('tunes the aerial tank to 1 MHz with the antenna and trimmer in series across it, Q near 100', () => {
    const r = resonator(res, 'aerial-tank');
    const { fr, q } = nodeQ(yAerial, t1);
    expect(rel(r.resonanceHz, fr)).toBeLessThan(1e-6);
    expect(Math.abs(fr - f0)).toBeLessThan(r.bandwidthHz! / 2);
    // the antenna branch is not a pure R ∥ C, so R∥/(ωLp) holds to about 1 %
    expect(rel(r.loadedQ, q)).toBeLessThan(0.01);
    expect(r.bandwidthHz!).toBeGreaterThan(8e3);
    expect(r.bandwidthHz!).toBeLessThan(13e3);
  });

  it('lets the triode’s plate resistance set the plate tank’s Q; the detector takes little', () => {
    const r = resonator(res, 'plate-tank');
    const att = nodeQ((f) => yPlate(f, true), t2);
    const off = nodeQ((f) => yPlate(f, false), t2);
    expect(rel(r.resonanceHz, att.fr)).toBeLessThan(1e-6);
    expect(rel(r.loadedQ, att.q)).toBeLessThan(1e-4);
    expect(rel(r.detachedQ, off.q)).toBeLessThan(1e-4);
    expect(r.loadingRatio!).toBeGreaterThan(doc.settings.thresholds.loadingWarn);
    expect(r.downstreamShare!).toBeCloseTo(2 / num(det, 'rLoad') / att.g, 4);
    expect((1 / num(tri, 'rout')) / att.g).toBeGreaterThan(0.8); // prettier-ignore
    expect(flagsOf(res, 'tank-overloaded')).toEqual([]);
  });

  it('has a triode voltage gain of gm·|Z_plate| and drives the detector well past its threshold', () => {
    const zPlate = abs(inv(yPlate(f0, true)));
    const s = res.stages.find((x) => x.id === 'triode')!;
    expect(s.voltageGainDb).toBeCloseTo(db20(num(tri, 'gm') * zPlate), 6);
    // EMF = √2·E·h/2 (peak, effective height h/2), into the branch, across the aerial node
    const es = Math.SQRT2 * num(ant, 'fieldRms') * (h / 2);
    const vGrid = abs(div(cx(es), mul(zBranch(f0), yAerial(f0))));
    const last = res.nodes[res.nodes.length - 1];
    expect(rel(last.vPeak, vGrid * num(tri, 'gm') * zPlate)).toBeLessThan(1e-6);
    expect(last.vPeak).toBeGreaterThan(10 * num(det, 'minInputPeakV'));
  });

  it('raises the high-voltage caution on the triode stage', () => {
    const cautions = flagsOf(res, 'caution').filter((f) => f.data?.caution === 'high-voltage');
    expect(cautions.map((f) => f.stageId)).toEqual(['triode']);
  });
});
