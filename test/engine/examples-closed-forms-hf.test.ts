/**
 * The shortwave superhet examples against closed forms written here (the values read from
 * the example files, so an edited example is checked, not a copied number). The element
 * models and their references are in helpers/closed-forms.ts.
 */
import type { AnalysisResult } from '../../shared/engine';
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
  yRc,
  coilParallel,
  unilateralGa,
  friisTotal,
  coupledPair,
} from './helpers/closed-forms';

describe('shortwave superhets: one tank against a critically coupled pair', () => {
  const single = example('shortwave-superhet-single-tank');
  const pair = example('shortwave-superhet-coupled-pair');
  const doc = single.doc;
  const f0 = doc.settings.f0Hz;
  const nIn = num(stageOf(doc, 'link-in'), 'n');
  const nOut = num(stageOf(doc, 'link-out'), 'n');
  const rAnt = num(stageOf(doc, 'antenna'), 'r');
  const amp = stageOf(doc, 'rf-amp');
  const mixer = stageOf(doc, 'mixer');
  const ifHz = num(mixer, 'ifHz');
  // An ideal transformer with V1 = n·V2 shows n²·Z (ENGINE.md): 50 Ω → 5 kΩ, and the
  // amplifier's rin ∥ cin appears across the tank as admittance y/n².
  const ySrc = cx(nIn * nIn / rAnt); // prettier-ignore
  const yAmp = (f: number) => scale(yRc(f, num(amp, 'rin'), num(amp, 'cin')), 1 / (nOut * nOut));
  const iNorton = (es: number) => cx((es * nIn) / rAnt);
  const es = 1;
  const tank = stageOf(doc, 'preselector');
  const [l, ql, c, qc] = ['l', 'ql', 'c', 'qc'].map((k) => num(tank, k));
  const yTank = (f: number) => add(inv(zCoil(f, l, ql)), yCap(f, c, qc));
  const tankV = (f: number) => abs(div(iNorton(es), add(ySrc, yTank(f), yAmp(f))));
  const pairStage = stageOf(pair.doc, 'preselector');
  const pp = {
    l: num(pairStage, 'l'),
    c: num(pairStage, 'c'),
    ql: num(pairStage, 'ql'),
    qc: num(pairStage, 'qc'),
    k: num(pairStage, 'k'),
  };
  const pairAt = (f: number) => coupledPair(f, pp, iNorton(es), ySrc, yAmp(f));
  /** Own parallel resistance of one tank (coil ∥ capacitor) at f. */
  const rOwn = (f: number, ll: number, q: number, cc: number, qcc: number) =>
    1 / (1 / coilParallel(f, ll, q).rp + (w(f) * cc) / qcc);

  it('puts the image at f0 + 2·IF for a high-side LO: 8.11 MHz', () => {
    const image = f0 + 2 * ifHz; // high-side LO: fLO = f0 + IF, image = fLO + IF
    for (const { res } of [single, pair]) {
      expect(res.selectivity.every((s) => s.imageHz === image)).toBe(true);
      expect(res.stages.find((s) => s.id === 'mixer')!.fOutHz).toBe(ifHz);
    }
  });

  it('single tank: f0 = 1/(2π√(LpC)), Q from coil ∥ C ∥ 5 kΩ ∥ 5 kΩ (about 21), and 36 detached', () => {
    const r = resonator(single.res, 'preselector');
    const lp = coilParallel(1, l, ql).lp;
    const cAmp = num(amp, 'cin') / (nOut * nOut);
    const fr = 1 / (2 * Math.PI * Math.sqrt(lp * (c + cAmp)));
    expect(rel(r.resonanceHz, fr)).toBeLessThan(1e-6);
    expect(Math.abs(fr - f0)).toBeLessThan(r.bandwidthHz! / 2);
    const rAmp = (nOut * nOut) * num(amp, 'rin'); // prettier-ignore
    const rTerm = rAnt / (nIn * nIn);
    const rO = rOwn(fr, l, ql, c, qc);
    const qLoaded = 1 / (1 / rO + 1 / rTerm + 1 / rAmp) / (w(fr) * lp);
    expect(rel(r.loadedQ, qLoaded)).toBeLessThan(1e-4);
    const frDet = 1 / (2 * Math.PI * Math.sqrt(lp * c));
    const qDet = 1 / (1 / rOwn(frDet, l, ql, c, qc) + 1 / rTerm) / (w(frDet) * lp);
    expect(rel(r.detachedQ, qDet)).toBeLessThan(1e-4);
    expect(flagsOf(single.res, 'tank-overloaded')).toEqual([]);
  });

  it('single tank: image rejection from the node admittance, near √(1 + (Qρ)²) (IMG-1)', () => {
    const image = f0 + 2 * ifHz;
    const exact = db20(tankV(f0) / tankV(image));
    const node = nodeAfter(doc, 'preselector');
    expect(single.res.selectivity[node].imageRejectionDb!).toBeCloseTo(exact, 3);
    // what the detector sees: everything after the tank is flat across 7.2–8.1 MHz
    const last = single.res.selectivity[single.res.selectivity.length - 1];
    expect(Math.abs(last.imageRejectionDb! - exact)).toBeLessThan(0.05);
    // IMG-1 (REFERENCES.md): α = √(1 + Q²ρ²), ρ = fi/f0 − f0/fi
    const q = resonator(single.res, 'preselector').loadedQ!;
    const rho = image / f0 - f0 / image;
    expect(Math.abs(exact - db20(Math.sqrt(1 + q * q * rho * rho)))).toBeLessThan(0.2);
    expect(exact).toBeGreaterThan(12);
    expect(exact).toBeLessThan(17);
  });

  it('single tank: the step-up at the tank node is I·|Z| of the node, over the sweep', () => {
    const node = nodeAfter(doc, 'preselector');
    const emf = Math.sqrt(8 * rAnt * 1e-3 * 10 ** (num(stageOf(doc, 'antenna'), 'powerDbm') / 10));
    expect(rel(single.res.nodes[node].vPeak, tankV(f0) * emf)).toBeLessThan(1e-6);
    const { freqsHz, nodes } = single.res.sweep!;
    for (const i of [0, 1000, 2400, 4220, freqsHz.length - 1]) {
      expect(nodes[node].stepUpDb[i]).toBeCloseTo(db20(tankV(freqsHz[i])), 6);
    }
  });

  it('single tank: the noise figure is Friis over the stages, dominated by the RF amplifier', () => {
    const gs = ySrc.re;
    const gTank = yTank(f0).re;
    const gaTank = gs / (gs + gTank); // shunt loss: GA = Gs/(Gs + G_tank), exact at any f
    const zsAmp = scale(inv(add(ySrc, yTank(f0))), 1 / (nOut * nOut));
    const gaAmp = unilateralGa(num(amp, 'gainDb'), num(amp, 'rin'), num(amp, 'cin'), num(amp, 'rout'), zsAmp, f0); // prettier-ignore
    const gaMix = unilateralGa(num(mixer, 'conversionGainDb'), num(mixer, 'rin'), 0, num(mixer, 'rout'), inv(yRc(f0, num(amp, 'rout'), num(amp, 'cout'))), f0); // prettier-ignore
    const ifFilter = stageOf(doc, 'if-filter');
    const gaFilter = fromDb10(-num(ifFilter, 'insertionLossDb')); // driven from its own z0
    const ifAmp = stageOf(doc, 'if-amp');
    const chain = [
      { f: 1 / gaTank, g: gaTank },
      { f: fromDb10(num(amp, 'nfDb')), g: gaAmp },
      { f: fromDb10(num(mixer, 'nfDb')), g: gaMix },
      { f: 1 / gaFilter, g: gaFilter },
      { f: fromDb10(num(ifAmp, 'nfDb')), g: fromDb10(num(ifAmp, 'gainDb')) },
    ];
    const total = friisTotal(chain);
    expect(single.res.levels.noiseFigureDb).toBeCloseTo(db10(total), 2);
    const ampShare = (chain[1].f - 1) / gaTank / (total - 1);
    expect(ampShare).toBeGreaterThan(0.5);
  });

  it('coupled pair: k·Q = 1 (critical) and a flat top √2·f0/Q wide (common practice, from memory)', () => {
    const rTerm = rAnt / (nIn * nIn);
    const lp = coilParallel(f0, pp.l, pp.ql).lp;
    const qTank = 1 / (1 / rOwn(f0, pp.l, pp.ql, pp.c, pp.qc) + 1 / rTerm) / (w(f0) * lp);
    expect(Math.abs(pp.k * qTank - 1)).toBeLessThan(0.01);
    const sel = pair.res.selectivity[nodeAfter(pair.doc, 'preselector')];
    expect(rel(sel.bw3dbHz, (Math.SQRT2 * f0) / qTank)).toBeLessThan(0.03);
    const centre = Math.sqrt(sel.bw3dbLowHz! * sel.bw3dbHighHz!);
    expect(Math.abs(centre - f0)).toBeLessThan(0.05 * sel.bw3dbHz!);
  });

  it('coupled pair: step-up and image rejection from the two-node admittance equations', () => {
    const node = nodeAfter(pair.doc, 'preselector');
    const image = f0 + 2 * ifHz;
    expect(pair.res.nodes[node].stepUp).toBeCloseTo(abs(pairAt(f0).v2) / es / 1, 6);
    const exact = db20(abs(pairAt(f0).v2) / abs(pairAt(image).v2));
    expect(pair.res.selectivity[node].imageRejectionDb!).toBeCloseTo(exact, 3);
  });

  it('coupled pair rejects the image at least 10 dB better than the single tank, for about 1 dB more loss', () => {
    const last = (r: AnalysisResult) => r.selectivity[r.selectivity.length - 1].imageRejectionDb!;
    expect(last(pair.res) - last(single.res)).toBeGreaterThan(10);
    // available gain of the pair: Thevenin of its output over the source's available power
    const { v2open, zth } = pairAt(f0);
    const pavOut = (abs(v2open) ** 2) / (8 * zth.re); // prettier-ignore
    const pavIn = (es * es) / (8 * rAnt);
    const gaPair = db10(pavOut / pavIn);
    const reported = pair.res.stages.find((s) => s.id === 'preselector')!.availableGainDb;
    expect(reported).toBeCloseTo(gaPair, 4);
    const gaSingle = single.res.stages.find((s) => s.id === 'preselector')!.availableGainDb;
    expect(gaSingle - gaPair).toBeGreaterThan(0.5);
    expect(pair.res.levels.noiseFigureDb).toBeGreaterThan(single.res.levels.noiseFigureDb + 0.5);
  });
});
