/**
 * Headline numbers of each example chain against closed forms written here, from the
 * values in the example files (so an edited example is checked, not a copied number).
 *
 * Element models are those ENGINE.md states (constant Q): a coil of quality Q has series
 * resistance ωL/Q, a capacitor a parallel conductance ωC/Q. Series-to-parallel conversion
 * Rp = ωL(Q + 1/Q), Lp = L(1 + 1/Q²) and loaded Q = R∥/(ωLp) are REFERENCES.md LQ-3.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain, type AnalysisResult } from '../../shared/engine';
import { chainDocumentSchema, type ChainDocument, type StageInstance } from '../../shared/schema/chain'; // prettier-ignore

// ---------------------------------------------------------------- loading

const DIR = path.join(__dirname, '..', '..', 'examples');
const cache = new Map<string, { doc: ChainDocument; res: AnalysisResult }>();
function example(key: string) {
  let hit = cache.get(key);
  if (!hit) {
    const { variantOf: _v, ...raw } = JSON.parse(readFileSync(path.join(DIR, `${key}.chain.json`), 'utf8')); // prettier-ignore
    const doc = chainDocumentSchema.parse(raw);
    hit = { doc, res: analyzeChain(doc, { sweep: true }) };
    cache.set(key, hit);
  }
  return hit;
}
const stageOf = (doc: ChainDocument, id: string): StageInstance => {
  const s = doc.stages.find((x) => x.id === id);
  if (!s) throw new Error(`example has no stage "${id}"`);
  return s;
};
const num = (s: StageInstance, key: string) => s.values[key] as number;
const resonator = (res: AnalysisResult, stageId: string, label = 'tank') =>
  res.resonators.find((r) => r.stageId === stageId && r.label === label)!;
/** User-level node after the stage with this id (node 0 is the source terminal). */
const nodeAfter = (doc: ChainDocument, id: string) => doc.stages.findIndex((s) => s.id === id);
const flagsOf = (res: AnalysisResult, code: string) => res.flags.filter((f) => f.code === code);
const rel = (a: number | null | undefined, b: number) => Math.abs((a as number) / b - 1);

// ---------------------------------------------------------------- complex arithmetic

interface Cx {
  re: number;
  im: number;
}
const cx = (re: number, im = 0): Cx => ({ re, im });
const add = (...zs: Cx[]) => zs.reduce((a, b) => cx(a.re + b.re, a.im + b.im), cx(0));
const mul = (a: Cx, b: Cx) => cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const inv = (a: Cx) => {
  const d = a.re * a.re + a.im * a.im;
  return cx(a.re / d, -a.im / d);
};
const div = (a: Cx, b: Cx) => mul(a, inv(b));
const neg = (a: Cx) => cx(-a.re, -a.im);
const abs = (a: Cx) => Math.hypot(a.re, a.im);
const scale = (a: Cx, k: number) => cx(a.re * k, a.im * k);
const db20 = (x: number) => 20 * Math.log10(x);
const db10 = (x: number) => 10 * Math.log10(x);
const fromDb10 = (db: number) => 10 ** (db / 10);
const w = (f: number) => 2 * Math.PI * f;

/** Coil impedance ωL/Q + jωL and capacitor admittance ωC/Q + jωC (ENGINE.md, constant Q). */
const zCoil = (f: number, l: number, q: number) => cx((w(f) * l) / q, w(f) * l);
const yCap = (f: number, c: number, q = Infinity) => cx((w(f) * c) / q, w(f) * c);
const zCap = (f: number, c: number, q = Infinity) => inv(yCap(f, c, q));
/** R ∥ C admittance. */
const yRc = (f: number, r: number, c: number) => cx(1 / r, w(f) * c);

/** Coil's parallel equivalent: Rp = ωL(Q + 1/Q), Lp = L(1 + 1/Q²) (LQ-3). */
const coilParallel = (f: number, l: number, q: number) => ({
  rp: w(f) * l * (q + 1 / q),
  lp: l * (1 + 1 / (q * q)),
});

/**
 * Available gain of a unilateral stage given as stated gain G between rin and rout, driven
 * from source impedance zs: with gm = 2√(G/(rin·rout)) (the catalogue's definition of a
 * stated gain), GA = gm²·|Zin/(Zs + Zin)|²·rout·Re Zs.
 */
function unilateralGa(statedDb: number, rin: number, cin: number, rout: number, zs: Cx, f: number) {
  const gm = 2 * Math.sqrt(fromDb10(statedDb) / (rin * rout));
  const zin = inv(yRc(f, rin, cin));
  const t = abs(div(zin, add(zs, zin)));
  return gm * gm * t * t * rout * zs.re;
}

/** Friis: F = F1 + (F2 − 1)/G1 + (F3 − 1)/(G1·G2) + … (linear). */
function friisTotal(stages: { f: number; g: number }[]): number {
  let f = 1;
  let g = 1;
  for (const s of stages) {
    f += (s.f - 1) / g;
    g *= s.g;
  }
  return f;
}

/**
 * Two shunt capacitors joined by coupled coils (M = k·L, each with loss ωL/Q), driven by a
 * Norton current i with source admittance ys, loaded by yl. Solves the two-node admittance
 * equations [Y11+ya, Y12; Y12, Y22+yb]·[V1; V2] = [i; 0], with Y the inverse of the coils'
 * Z-matrix [[z, jωM], [jωM, z]]. Returns the output voltage, the output's Thevenin
 * impedance (load removed) and the open-circuit voltage.
 */
function coupledPair(
  f: number,
  p: { l: number; c: number; ql: number; qc: number; k: number },
  i: Cx,
  ys: Cx,
  yl: Cx,
) {
  const z = zCoil(f, p.l, p.ql);
  const zm = cx(0, w(f) * p.k * p.l);
  const det = add(mul(z, z), neg(mul(zm, zm)));
  const y11 = div(z, det);
  const y12 = neg(div(zm, det));
  const yc = yCap(f, p.c, p.qc);
  const a11 = add(y11, yc, ys);
  const a22open = add(y11, yc);
  const a22 = add(a22open, yl);
  const v2 = div(neg(mul(y12, i)), add(mul(a11, a22), neg(mul(y12, y12))));
  const v2open = div(neg(mul(y12, i)), add(mul(a11, a22open), neg(mul(y12, y12))));
  const zth = inv(add(a22open, neg(div(mul(y12, y12), a11))));
  return { v2, v2open, zth };
}

/** Real root of g on [lo, hi] by bisection (g changes sign across the bracket). */
function root(g: (x: number) => number, lo: number, hi: number): number {
  const sLo = Math.sign(g(lo));
  for (let k = 0; k < 200; k++) {
    const mid = 0.5 * (lo + hi);
    if (Math.sign(g(mid)) === sLo) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

// ---------------------------------------------------------------- long wave

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

// ---------------------------------------------------------------- shortwave superhets

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

// ---------------------------------------------------------------- VHF and UHF

/** Peak EMF of a generator with available power P (dBm): P = Es²/(8R) (ENGINE.md, peak phasors). */
const emfOf = (s: StageInstance) => Math.sqrt(8 * num(s, 'r') * 1e-3 * 10 ** (num(s, 'powerDbm') / 10)); // prettier-ignore
/** Loss (dB) of a line of `lossDbPerM` at refHz, scaled with √f (the catalogue's conductor-loss model). */
const lineLossDb = (s: StageInstance, f: number) =>
  num(s, 'lossDbPerM') * num(s, 'length') * Math.sqrt(f / num(s, 'refHz'));
/** Return loss of Zin against Zsrc* (ENGINE.md): −20·log10 |(Zin − Zsrc*)/(Zin + Zsrc)|. */
const returnLoss = (zin: Cx, zsrc: Cx) =>
  -db20(abs(div(add(zin, neg(cx(zsrc.re, -zsrc.im))), add(zin, zsrc))));

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
