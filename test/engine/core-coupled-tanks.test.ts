/**
 * Loaded Q of the two tanks of a coupled pair.
 *
 * Check values come from coupled-resonator theory (common practice; the relations are
 * from memory): a parallel tank of inductance L terminated by a parallel resistance R has
 * Q = R/(ωL); two such tanks with equal terminations are critically coupled at k = 1/Q,
 * and at the common resonance each then reflects into the other a conductance equal to
 * that tank's own termination, so the second tank's Q halves when the load is attached.
 */
import { analyzeChain, buildChain, frequencyGrid, runNodeAnalysis } from '../../shared/engine';
import { ownSusceptanceZero } from '../../shared/engine/core/coupled-pair';
import {
  coupledExtract,
  probePointEval,
  resonate,
} from '../../shared/engine/core/extract-resonance';
import { createProbe } from '../../shared/engine/core/probe';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import { benchChain } from '../../scripts/bench/bench-chain';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const F0 = 7.2e6;
const L = 1e-6;
const C = 1 / ((2 * Math.PI * F0) ** 2 * L);
const R = 2000;
const Q_TERM = R / (2 * Math.PI * F0 * L); // ≈ 44.2
/** Coil and capacitor Q high enough that their loss moves the figures by < 0.5 %. */
const Q_PART = 1e5;

function pair(coupling: 'mutual' | 'top-c', extra: Record<string, number>): ChainDocument {
  return parseChainDocument({
    name: 'coupled pair',
    settings: { f0Hz: F0, sweep: { startHz: 6e6, stopHz: 8.4e6, points: 401, scale: 'lin' } },
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: R, level: 'emf', emf: 1 } },
      {
        id: 'bp',
        type: 'coupled-bandpass',
        label: 'Preselector',
        values: { coupling, l: L, c: C, ql: Q_PART, qc: Q_PART, ...extra },
      },
      { id: 'ld', type: 'rc-load', label: 'Next stage', values: { r: R, c: 0 } },
    ],
  });
}

describe('coupled pair of tanks', () => {
  it('should give the first tank its source-terminated Q when detached from its partner', () => {
    const res = analyzeChain(pair('mutual', { k: 1 / Q_TERM }), { sweep: false });
    const first = res.resonators.find((r) => r.label === 'first tank')!;
    // Q = R/(ωL) of the tank with only its own termination (see header).
    expect(first.detachedQ!).toBeCloseTo(Q_TERM, -0.3);
    expect(Math.abs(first.detachedQ! / Q_TERM - 1)).toBeLessThan(0.005);
    // Its partner damps it on purpose: no loading ratio, hence no loading flag.
    expect(first.loadingRatio).toBeNull();
    expect(first.resonanceHz! / F0).toBeCloseTo(1, 4);
  });

  it('should halve the second tank Q at critical coupling when the load is attached', () => {
    const res = analyzeChain(pair('mutual', { k: 1 / Q_TERM }), { sweep: false });
    const second = res.resonators.find((r) => r.label === 'second tank')!;
    // Reflected conductance = own termination at critical coupling (see header):
    // detached Q = Q_TERM, attached Q = Q_TERM / 2, ratio 0.5, load takes half the damping.
    expect(Math.abs(second.detachedQ! / Q_TERM - 1)).toBeLessThan(0.01);
    expect(Math.abs(second.loadedQ! / (Q_TERM / 2) - 1)).toBeLessThan(0.01);
    expect(second.loadingRatio!).toBeCloseTo(0.5, 2);
    expect(second.downstreamShare!).toBeCloseTo(0.5, 2);
  });

  it('should flag the second tank, not the first, when a low resistance loads the pair', () => {
    const doc = pair('mutual', { k: 1 / Q_TERM });
    doc.stages[2].values = { r: R / 20, c: 0 };
    const res = analyzeChain(doc, { sweep: false });
    const overloaded = res.flags.filter((f) => f.code === 'tank-overloaded');
    expect(overloaded).toHaveLength(1);
    expect(overloaded[0].stageId).toBe('bp');
    expect(overloaded[0].message).toContain('second tank');
    expect(overloaded[0].severity).toBe('error');
  });

  it('should not raise a false loading error on a top-capacitor pair near critical coupling', () => {
    // Top-C coupling: k ≈ Cc/C for Cc ≪ C (common practice); tanks retuned for Cc.
    const cc = C / Q_TERM;
    const res = analyzeChain(pair('top-c', { cc, c: C - cc }), { sweep: false });
    expect(res.flags.filter((f) => f.severity === 'error')).toEqual([]);
    const second = res.resonators.find((r) => r.label === 'second tank')!;
    expect(second.loadingRatio!).toBeGreaterThan(0.4);
    expect(second.loadingRatio!).toBeLessThan(0.6);
  });
});

describe('a tank with no frequency change before it', () => {
  it('finds its resonances on its own susceptance: the same numbers as the chain searched at every step', () => {
    const built = buildChain(parseChainDocument(benchChain(2001)), STAGE_DEFINITIONS);
    const na = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
    const stage = built.twoPorts.find((s) => s.id === 'preselector')!;
    const decls = stage.model.resonators!.filter((d) => d.kind === 'shunt');
    expect(decls).toHaveLength(2);
    for (const decl of decls) {
      const first = decl.coupledPartner === 'downstream';
      const flat = first ? stage.firstSection : stage.firstSection + stage.sectionCount;
      const own = decl.ownAdmittance!;
      const extracts = [
        coupledExtract(flat, own, true, true, false),
        coupledExtract(flat, own, true, false, first),
      ];
      const probe = createProbe(built);
      const at = probePointEval(probe, flat);
      const f0 = built.settings.f0Hz;
      const searched = extracts.map((x) => resonate(at, na.freqs, na, x, f0));
      const fast = ownSusceptanceZero(at, own, na.freqs, f0, extracts);
      expect(searched.every((r) => r !== null)).toBe(true);
      expect(fast).toEqual(searched);
    }
  });
});
