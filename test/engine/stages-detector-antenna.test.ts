/**
 * The diode envelope detector with a level-dependent input resistance, and the short
 * antenna with a stated current distribution.
 *
 * Independent references, computed here:
 * - I0 and I1 by their power series Iν(x) = Σ (x/2)^(2k+ν) / (k!·(k+ν)!) (Abramowitz and
 *   Stegun 9.6.10);
 * - the detector's DC balance and fundamental current by integrating the diode equation
 *   i = Is·(exp((V·cos θ − Vo)/(n·VT)) − 1) over one cycle numerically (no Bessel
 *   functions), VT = kT/q with the CODATA constants;
 * - short monopole over perfect ground (C. A. Balanis, "Antenna Theory", short dipoles halved
 *   by image theory; from memory): triangular current R = 40π²(h/λ)², effective height h/2;
 *   uniform current R = 160π²(h/λ)², effective height h.
 */
import { analyzeChain } from '../../shared/engine';
import { chainToSpice, SpiceExportError } from '../../shared/engine/spice/netlist';
import {
  detectorInputResistance,
  logBesselI01,
  thermalVoltage,
} from '../../shared/engine/stages/diode-detector';
import { shortMonopole } from '../../shared/engine/stages/sources';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const VT290 = (1.380649e-23 * 290) / 1.602176634e-19;

function besselSeries(x: number, nu: 0 | 1): number {
  let sum = 0;
  let term = nu === 0 ? 1 : x / 2; // k = 0
  for (let k = 0; k < 400; k++) {
    sum += term;
    term *= (x / 2) ** 2 / ((k + 1) * (k + 1 + nu));
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

/** Rin by integrating the diode current over a cycle (trapezoid rule, periodic: spectral). */
function rinByIntegration(v: number, rLoad: number, is: number, n: number): number {
  const nvt = n * VT290;
  const N = 4096;
  const avg = (vo: number, weight: (t: number) => number) => {
    let s = 0;
    for (let j = 0; j < N; j++) {
      const t = (2 * Math.PI * j) / N;
      s += is * (Math.exp((v * Math.cos(t) - vo) / nvt) - 1) * weight(t);
    }
    return s / N;
  };
  let lo = 0;
  let hi = v;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (avg(mid, () => 1) - mid / rLoad > 0) lo = mid;
    else hi = mid;
  }
  const vo = 0.5 * (lo + hi);
  const i1 = 2 * avg(vo, Math.cos); // amplitude of the cos θ component
  return v / i1;
}

describe('diode envelope detector, input resistance from the level', () => {
  const parts = { rLoad: 10e3, is: 3e-6, n: 1.05, temperatureK: 290 };

  it.each([0.5, 2, 3.75, 5, 10, 20, 60])('ln I0, ln I1 at x = %d agree with the series', (x) => {
    const { lnI0, lnI1 } = logBesselI01(x);
    expect(Math.abs(Math.exp(lnI0) / besselSeries(x, 0) - 1)).toBeLessThan(5e-7); // A&S quote about 2e-7 on the scaled forms
    expect(Math.abs(Math.exp(lnI1) / besselSeries(x, 1) - 1)).toBeLessThan(5e-7); // A&S quote about 2e-7 on the scaled forms
  });

  it('is n·VT/Is at a weak drive and about RL/2 at a strong one', () => {
    expect(thermalVoltage(290)).toBeCloseTo(VT290, 15);
    const small = (parts.n * VT290) / parts.is;
    expect(detectorInputResistance(0, parts)).toBeCloseTo(small, 6);
    expect(detectorInputResistance(1e-5, parts) / small - 1).toBeLessThan(1e-6);
    expect(detectorInputResistance(100, parts) / (parts.rLoad / 2) - 1).toBeLessThan(0.01);
  });

  it.each([0.01, 0.05, 0.2, 1])('agrees with a numerical integration at %d V peak', (v) => {
    const want = rinByIntegration(v, parts.rLoad, parts.is, parts.n);
    expect(Math.abs(detectorInputResistance(v, parts) / want - 1)).toBeLessThan(1e-5);
  });

  const chainWith = (emf: number) =>
    parseChainDocument({
      name: 'detector level',
      settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 2e6, points: 11, scale: 'lin' as const } }, // prettier-ignore
      stages: [
        { id: 'g', type: 'resistive-generator', values: { r: 2000, level: 'emf', emf } },
        { id: 'd', type: 'envelope-detector', values: { rLoad: 10e3, c: 0, inputModel: 'diode', n: 1.05, is: 3e-6 } }, // prettier-ignore
      ],
    });

  it.each([1e-4, 0.05, 0.5, 20])(
    'in a chain (EMF %d V) the node settles where the divider and the diode agree',
    (emf) => {
      const res = analyzeChain(chainWith(emf));
      const node = res.nodes[0];
      const rin = detectorInputResistance(node.vPeak, parts);
      expect(node.zIn.re / rin - 1).toBeLessThan(1e-9);
      expect(Math.abs(node.vPeak - (emf * rin) / (2000 + rin))).toBeLessThan(1e-9 * emf);
    },
  );

  it('has no SPICE form in the level-dependent mode, and says which stage', () => {
    expect(() => chainToSpice(chainWith(0.5))).toThrow(SpiceExportError);
  });

  it('keeps the half-load rule by default (stored chains keep their figures)', () => {
    const doc = chainWith(0.5);
    doc.stages[1].values = { rLoad: 10e3, c: 0 };
    expect(analyzeChain(doc).nodes[0].zIn.re).toBeCloseTo(5000, 9);
  });
});

describe('short antenna with a stated current distribution', () => {
  const C0 = 299_792_458;
  const base = { height: 2, diameter: 2e-3, lossR: 3, fieldRms: 1e-3 };
  const f0 = 1e6;
  const analyse = (values: Record<string, unknown>) =>
    analyzeChain(
      parseChainDocument({
        name: 'short antenna',
        settings: { f0Hz: f0, sweep: { startHz: f0, stopHz: f0, points: 1, scale: 'lin' } },
        stages: [
          { id: 'a', type: 'short-monopole', values: { ...base, ...values } },
          { id: 'l', type: 'rc-load', values: { r: 1e12, c: 0 } },
        ],
      }),
    );
  const whipC = shortMonopole(base.height, base.diameter).capacitance;

  it.each([
    ['triangular', 40, 0.5, 0],
    ['uniform', 160, 1, 30e-12],
  ] as const)('%s current: R = %iπ²(h/λ)², effective height %d·h', (current, k, he, topHat) => {
    const res = analyse({ current, topHatC: topHat });
    const zs = res.nodes[0].zSrc;
    const rRad = k * Math.PI ** 2 * (base.height / (C0 / f0)) ** 2;
    expect(zs.re).toBeCloseTo(rRad + base.lossR, 12);
    const c = whipC + topHat;
    expect(zs.im).toBeCloseTo(-1 / (2 * Math.PI * f0 * c), 6);
    // Into an open circuit the node carries the whole EMF, √2·E·h_eff peak.
    expect(res.nodes[0].vPeak / (Math.SQRT2 * base.fieldRms * he * base.height) - 1).toBeLessThan(1e-9); // prettier-ignore
  });

  it('ignores the top hat for a plain whip', () => {
    const a = analyse({ current: 'triangular', topHatC: 100e-12 }).nodes[0].zSrc;
    const b = analyse({ current: 'triangular', topHatC: 0 }).nodes[0].zSrc;
    expect(a).toEqual(b);
  });
});
