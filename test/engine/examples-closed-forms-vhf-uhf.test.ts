/**
 * The VHF and UHF examples against closed forms written here (the values read from the
 * example files, so an edited example is checked, not a copied number). The element models
 * and their references are in helpers/closed-forms.ts.
 */
import type { ChainDocument } from '../../shared/schema/chain';
import {
  example,
  stageOf,
  num,
  resonator,
  nodeAfter,
  flagsOf,
  rel,
  cx,
  add,
  inv,
  div,
  abs,
  scale,
  db20,
  db10,
  fromDb10,
  w,
  zCoil,
  yCap,
  zCap,
  yRc,
  coilParallel,
  unilateralGa,
  friisTotal,
  coupledPair,
  root,
  emfOf,
  lineLossDb,
  returnLoss,
} from './helpers/closed-forms';

describe('two-metre-coupled-preselector: cable, tapped coupled pair, LNA, designed L-match', () => {
  const { doc, res } = example('two-metre-coupled-preselector');
  const f0 = doc.settings.f0Hz;
  const feeder = stageOf(doc, 'feeder');
  const nIn = num(stageOf(doc, 'tap-in'), 'n');
  const nOut = num(stageOf(doc, 'tap-out'), 'n');
  const lna = stageOf(doc, 'lna');
  const pre = stageOf(doc, 'preselector');
  const pp = { l: num(pre, 'l'), c: num(pre, 'c'), ql: num(pre, 'ql'), qc: num(pre, 'qc'), k: num(pre, 'k') }; // prettier-ignore
  const z0 = num(feeder, 'z0');
  // A matched line from a Z0 generator: Thevenin Es·10^(−loss/20) behind exactly Z0.
  const vth = (f: number) => 10 ** (-lineLossDb(feeder, f) / 20);
  const at = (f: number) =>
    coupledPair(
      f,
      pp,
      cx((vth(f) * nIn) / z0),
      cx((nIn * nIn) / z0),
      scale(yRc(f, num(lna, 'rin'), num(lna, 'cin')), 1 / (nOut * nOut)),
    );

  it('loses exactly the cable loss in the feeder: 0.07 dB/m × 10 m', () => {
    const s = res.stages.find((x) => x.id === 'feeder')!;
    expect(s.availableGainDb).toBeCloseTo(-lineLossDb(feeder, f0), 6);
  });

  it('is critically coupled, k·Q = 1, with each tank loaded to Q of about 18 by its tap', () => {
    const rTerm = z0 / (nIn * nIn);
    const lp = coilParallel(f0, pp.l, pp.ql).lp;
    const rOwn = 1 / (1 / coilParallel(f0, pp.l, pp.ql).rp + (w(f0) * pp.c) / pp.qc);
    const qTank = 1 / (1 / rOwn + 1 / rTerm) / (w(f0) * lp);
    expect(Math.abs(pp.k * qTank - 1)).toBeLessThan(0.02);
    const sel = res.selectivity[nodeAfter(doc, 'lna')];
    expect(rel(sel.bw3dbHz, (Math.SQRT2 * f0) / qTank)).toBeLessThan(0.03);
    expect(Math.abs(Math.sqrt(sel.bw3dbLowHz! * sel.bw3dbHighHz!) - f0)).toBeLessThan(1e6);
    // the whole 144–146 MHz band within 0.5 dB of the peak
    const [band] = sel.offsets;
    expect(band.offsetHz).toBe(1e6);
    expect(Math.max(band.belowDb!, band.aboveDb!)).toBeLessThan(0.5);
  });

  it('gives the step-up of the two-node admittance equations across the sweep', () => {
    const node = nodeAfter(doc, 'preselector');
    expect(rel(res.nodes[node].stepUp, abs(at(f0).v2))).toBeLessThan(1e-6);
    const { freqsHz, nodes } = res.sweep!;
    for (const i of [0, 500, 1000, 1300, freqsHz.length - 1]) {
      expect(nodes[node].stepUpDb[i]).toBeCloseTo(db20(abs(at(freqsHz[i]).v2)), 5);
    }
  });

  it('has a noise figure of cable + preselector loss + LNA by Friis (about 2.5 dB)', () => {
    const { v2open, zth } = at(f0);
    const gaPre = ((abs(v2open) ** 2) / (8 * zth.re)) / ((vth(f0) ** 2) / (8 * z0)); // prettier-ignore
    expect(res.stages.find((s) => s.id === 'preselector')!.availableGainDb).toBeCloseTo(db10(gaPre), 5); // prettier-ignore
    const gaLine = 10 ** (-lineLossDb(feeder, f0) / 10);
    const nf = db10(friisTotal([
      { f: 1 / gaLine, g: gaLine },
      { f: 1 / gaPre, g: gaPre },
      { f: fromDb10(num(lna, 'nfDb')), g: fromDb10(num(lna, 'gainDb')) },
    ])); // prettier-ignore
    // the L-match after 18 dB of gain adds well under 0.01 dB
    expect(res.levels.noiseFigureDb - nf).toBeGreaterThanOrEqual(0);
    expect(res.levels.noiseFigureDb - nf).toBeLessThan(0.01);
  });

  it('designs the L-match by Q = √(R2/R1 − 1), absorbing the 3 pF, and meets it (no flag)', () => {
    const m = stageOf(doc, 'match');
    const adc = stageOf(doc, 'receiver-input');
    const q = Math.sqrt(num(m, 'r2') / num(m, 'r1') - 1);
    const l = (q * num(m, 'r1')) / w(f0); // series X = Q·Rlow
    const c = q / (w(f0) * num(m, 'r2')) - num(m, 'parasiticC'); // shunt X = Rhigh/Q
    const zin = add(zCoil(f0, l, num(m, 'ql')), inv(add(yCap(f0, c, num(m, 'qc')), yRc(f0, num(adc, 'r'), num(adc, 'c'))))); // prettier-ignore
    const node = res.nodes[nodeAfter(doc, 'lna')];
    expect(rel(node.zIn.re, zin.re)).toBeLessThan(1e-6);
    expect(Math.abs(node.zIn.im - zin.im)).toBeLessThan(1e-6 * abs(zin));
    const zs = inv(yRc(f0, num(lna, 'rout'), num(lna, 'cout')));
    expect(node.matchReturnLossDb).toBeCloseTo(returnLoss(zin, zs), 6);
    expect(node.matchReturnLossDb).toBeGreaterThan(doc.settings.thresholds.matchReturnLossDb);
    expect(flagsOf(res, 'match-missed')).toEqual([]);
  });
});

describe('sensor-868-front-end: SAW filter and an L-match that forgets, then absorbs, the LNA capacitance', () => {
  const parent = example('sensor-868-front-end');
  const fixed = example('sensor-868-front-end-absorbed');
  const f0 = parent.doc.settings.f0Hz;

  /** The high-pass L-match (series C, shunt L) from its design inputs, and what it presents. */
  function match(doc: ChainDocument, f: number) {
    const m = stageOf(doc, 'match');
    const lna = stageOf(doc, 'lna');
    const [r1, r2] = [num(m, 'r1'), num(m, 'r2')];
    const q = Math.sqrt(r2 / r1 - 1);
    const c = 1 / (w(f0) * q * r1); // series X = Q·Rlow
    // shunt X = Rhigh/Q, in parallel with the inductor that resonates the parasitic out
    const l = 1 / (1 / (r2 / q / w(f0)) + w(f0) ** 2 * num(m, 'parasiticC'));
    const zc = zCap(f, c, num(m, 'qc'));
    const zl = zCoil(f, l, num(m, 'ql'));
    const yLna = yRc(f, num(lna, 'rin'), num(lna, 'cin'));
    const zin = add(zc, inv(add(inv(zl), yLna)));
    // output Thevenin from a 50 Ω source (load removed)
    const zs = cx(50);
    const vth = div(zl, add(zs, zc, zl));
    const zth = inv(add(inv(add(zs, zc)), inv(zl)));
    const ga = (abs(vth) ** 2 / zth.re) * zs.re; // Pav,out / Pav,in
    return { zin, zth, ga, c, l };
  }

  it('reports the parts its design chose (Q = √(R2/R1 − 1), X_C = Q·R1, X_L = R2/Q), for the card', () => {
    for (const { doc, res } of [parent, fixed]) {
      const { c, l } = match(doc, f0);
      const report = res.stages.find((s) => s.id === 'match')!;
      expect(rel(report.designedValues!.c, c)).toBeLessThan(1e-9);
      expect(rel(report.designedValues!.l, l)).toBeLessThan(1e-9);
    }
    // Only the designed stage carries them.
    expect(parent.res.stages.filter((s) => s.designedValues).map((s) => s.id)).toEqual(['match']);
  });

  it('misses the match when the 1.2 pF is left out, and says so with the return loss', () => {
    const { zin } = match(parent.doc, f0);
    const rl = returnLoss(zin, cx(50)); // the matched SAW block looks back as exactly 50 Ω
    const node = parent.res.nodes[nodeAfter(parent.doc, 'saw')];
    expect(node.matchReturnLossDb).toBeCloseTo(rl, 6);
    expect(rl).toBeLessThan(parent.doc.settings.thresholds.matchReturnLossDb);
    const [flag] = flagsOf(parent.res, 'match-missed');
    expect(flag).toMatchObject({ stageId: 'match', severity: 'warning' });
    expect(flag.data!.returnLossDb as number).toBeCloseTo(rl, 6);
  });

  it('meets the match once the parasitic is absorbed into the shunt inductor', () => {
    const { zin } = match(fixed.doc, f0);
    expect(Math.abs(zin.re - 50)).toBeLessThan(5); // lossy parts move it off 50 Ω slightly
    const node = fixed.res.nodes[nodeAfter(fixed.doc, 'saw')];
    expect(node.matchReturnLossDb).toBeCloseTo(returnLoss(zin, cx(50)), 6);
    expect(node.matchReturnLossDb).toBeGreaterThan(20);
    expect(flagsOf(fixed.res, 'match-missed')).toEqual([]);
    expect(fixed.res.levels.totalGainDb).toBeGreaterThan(parent.res.levels.totalGainDb);
  });

  it('puts the image at f0 − 2·IF (low-side LO) and rejects it by the SAW block’s ultimate rejection', () => {
    const mixer = stageOf(fixed.doc, 'mixer');
    const image = f0 - 2 * num(mixer, 'ifHz'); // fLO = f0 − IF, image = fLO − IF
    const saw = stageOf(fixed.doc, 'saw');
    // order-N Butterworth bandpass, Ω = (f² − fc²)/(f·B), floored at the ultimate rejection r
    const r2 = 10 ** (-num(saw, 'ultimateRejectionDb') / 10);
    const om = (image ** 2 - num(saw, 'centreHz') ** 2) / (image * num(saw, 'bandwidthHz'));
    const expected = -db10(r2 + (1 - r2) / (1 + om ** (2 * num(saw, 'order'))));
    const sel = fixed.res.selectivity[nodeAfter(fixed.doc, 'lna')];
    expect(sel.imageHz).toBe(image);
    expect(Math.abs(sel.imageRejectionDb! - expected)).toBeLessThan(0.1);
  });

  it('narrows to the 180 kHz IF filter after the mixer', () => {
    for (const { doc, res } of [parent, fixed]) {
      const sel = res.selectivity[res.selectivity.length - 1];
      const bw = num(stageOf(doc, 'if-filter'), 'bandwidthHz');
      expect(rel(sel.bw3dbHz, bw)).toBeLessThan(0.01);
    }
  });

  it('cascades its noise by Friis: SAW loss, L-match loss, LNA, mixer, IF filter, IF strip', () => {
    for (const { doc, res } of [parent, fixed]) {
      const saw = fromDb10(-num(stageOf(doc, 'saw'), 'insertionLossDb'));
      const m = match(doc, f0);
      const lna = stageOf(doc, 'lna');
      const mixer = stageOf(doc, 'mixer');
      const gaLna = unilateralGa(num(lna, 'gainDb'), num(lna, 'rin'), num(lna, 'cin'), num(lna, 'rout'), m.zth, f0); // prettier-ignore
      const gaMix = unilateralGa(num(mixer, 'conversionGainDb'), num(mixer, 'rin'), 0, num(mixer, 'rout'), inv(yRc(f0, num(lna, 'rout'), num(lna, 'cout'))), f0); // prettier-ignore
      const iff = fromDb10(-num(stageOf(doc, 'if-filter'), 'insertionLossDb'));
      const strip = stageOf(doc, 'if-strip');
      const total = friisTotal([
        { f: 1 / saw, g: saw },
        { f: 1 / m.ga, g: m.ga },
        { f: fromDb10(num(lna, 'nfDb')), g: gaLna },
        { f: fromDb10(num(mixer, 'nfDb')), g: gaMix },
        { f: 1 / iff, g: iff },
        { f: fromDb10(num(strip, 'nfDb')), g: fromDb10(num(strip, 'gainDb')) },
      ]);
      expect(res.levels.noiseFigureDb).toBeCloseTo(db10(total), 3);
    }
  });
});

describe('marine-vhf-sdr: cable, changeover relay, series preselector, LNA, designed pi match', () => {
  const { doc, res } = example('marine-vhf-sdr');
  const f0 = doc.settings.f0Hz;
  const feeder = stageOf(doc, 'feeder');
  const relay = stageOf(doc, 'changeover');
  const pre = stageOf(doc, 'preselector');
  const lna = stageOf(doc, 'lna');
  const [l, ql, c, qc] = ['l', 'ql', 'c', 'qc'].map((k) => num(pre, k));
  const zSeries = (f: number) => add(zCoil(f, l, ql), zCap(f, c, qc));
  const zLna = (f: number) => inv(yRc(f, num(lna, 'rin'), num(lna, 'cin')));
  // matched line and matched pad from a 50 Ω generator: Thevenin exactly 50 Ω
  const vth = (f: number) => 10 ** (-(lineLossDb(feeder, f) + num(relay, 'insertionLossDb')) / 20);
  const loop = (f: number) => add(cx(50), zSeries(f), zLna(f));
  const vLna = (f: number) => vth(f) * abs(div(zLna(f), loop(f)));

  it('loses the cable loss (√f scaled) and the relay’s 0.3 dB exactly', () => {
    const ga = (id: string) => res.stages.find((s) => s.id === id)!.availableGainDb;
    expect(ga('feeder')).toBeCloseTo(-lineLossDb(feeder, f0), 6);
    expect(ga('changeover')).toBeCloseTo(-num(relay, 'insertionLossDb'), 6);
  });

  it('resonates the series LC where the loop reactance is zero, with Q = ωL/R of about 3.2', () => {
    const fr = root((f) => loop(f).im, 0.8 * f0, 1.2 * f0);
    const r = resonator(res, 'preselector', 'series LC');
    expect(rel(r.resonanceHz, fr)).toBeLessThan(1e-6);
    expect(Math.abs(fr - f0)).toBeLessThan(r.bandwidthHz! / 2);
    // Q = (ω/2R)·dX/dω of the loop (ENGINE.md), dX/dω by central difference here
    const h = fr * 1e-5;
    const dxdw = (loop(fr + h).im - loop(fr - h).im) / (w(fr + h) - w(fr - h));
    expect(rel(r.loadedQ, (w(fr) / (2 * loop(fr).re)) * dxdw)).toBeLessThan(1e-4);
    // and the textbook ωL/R_total, to 1 %
    expect(rel(r.loadedQ, (w(fr) * l) / loop(fr).re)).toBeLessThan(0.01);
  });

  it('passes 156–162 MHz within a fraction of a dB and attenuates FM broadcast at 100 MHz', () => {
    const node = nodeAfter(doc, 'preselector');
    const { freqsHz, nodes } = res.sweep!;
    const es = emfOf(stageOf(doc, 'antenna'));
    expect(rel(res.nodes[node].vPeak, vLna(f0) * es)).toBeLessThan(1e-6);
    for (const f of [100e6, 156e6, 159e6, 162e6, 200e6]) {
      const i = freqsHz.findIndex((x) => Math.abs(x - f) < 1);
      expect(nodes[node].stepUpDb[i]).toBeCloseTo(db20(vLna(f)), 5);
    }
    expect(db20(vLna(f0) / vLna(162e6))).toBeLessThan(0.5);
    expect(db20(vLna(f0) / vLna(156e6))).toBeLessThan(0.5);
    expect(db20(vLna(f0) / vLna(100e6))).toBeGreaterThan(8);
  });

  it('designs the pi match through Rv = Rhigh/(Q² + 1) (PI-1) and meets it at f0', () => {
    const m = stageOf(doc, 'match');
    const adc = stageOf(doc, 'converter');
    const [r1, r2, q, fd] = [num(m, 'r1'), num(m, 'r2'), num(m, 'q'), num(m, 'f0')];
    const rv = Math.max(r1, r2) / (q * q + 1);
    const q1 = Math.sqrt(r1 / rv - 1);
    const q2 = Math.sqrt(r2 / rv - 1);
    const c1 = q1 / (w(fd) * r1);
    const lm = (rv * (q1 + q2)) / w(fd);
    const c2 = q2 / (w(fd) * r2) - num(m, 'parasiticC');
    const zin = inv(add(yCap(f0, c1, num(m, 'qc')), inv(add(zCoil(f0, lm, num(m, 'ql')), inv(add(yCap(f0, c2, num(m, 'qc')), yRc(f0, num(adc, 'r'), num(adc, 'c')))))))); // prettier-ignore
    const node = res.nodes[nodeAfter(doc, 'lna')];
    expect(rel(node.zIn.re, zin.re)).toBeLessThan(1e-6);
    expect(Math.abs(node.zIn.im - zin.im)).toBeLessThan(1e-6 * abs(zin));
    expect(node.matchReturnLossDb).toBeGreaterThan(doc.settings.thresholds.matchReturnLossDb);
    expect(flagsOf(res, 'match-missed')).toEqual([]);
    expect(flagsOf(res, 'q-budget')).toEqual([]);
  });

  it('has a noise figure of the losses ahead of the LNA plus its 1 dB, by Friis', () => {
    const gaLine = 10 ** (-lineLossDb(feeder, f0) / 10);
    const gaRelay = 10 ** (-num(relay, 'insertionLossDb') / 10);
    const gaPre = 50 / (50 + zSeries(f0).re); // series Z from a real source: Rs/(Rs + Re Z)
    const nf = db10(friisTotal([
      { f: 1 / gaLine, g: gaLine },
      { f: 1 / gaRelay, g: gaRelay },
      { f: 1 / gaPre, g: gaPre },
      { f: fromDb10(num(lna, 'nfDb')), g: fromDb10(num(lna, 'gainDb')) },
    ])); // prettier-ignore
    expect(res.levels.noiseFigureDb - nf).toBeGreaterThanOrEqual(0);
    expect(res.levels.noiseFigureDb - nf).toBeLessThan(0.01);
  });
});
