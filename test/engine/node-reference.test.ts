/**
 * VSWR and return loss only against a reference the user chose (chain-wide or per port),
 * and levels at a node in volts and as dBm across that reference.
 *
 * Independent references: for a resistive Zin = R against a real reference R0,
 * Γ = (R − R0)/(R + R0), RL = −20·log10|Γ|, VSWR = (1 + |Γ|)/(1 − |Γ|) (definitions;
 * common practice). A sine of V peak across R dissipates V²/(2R).
 */
import { analyzeChain } from '../../shared/engine';
import { chain, TEST_CATALOGUE } from './core-fixtures';

const opts = { catalogue: TEST_CATALOGUE };
/** A 1 kΩ source into a 1 kΩ load: a kilohm node, matched to what it really sees. */
const kilohm = (settings: Record<string, unknown> = {}) =>
  chain(
    [
      { type: 't-source', values: { rs: 1000, emf: 2e-3 } },
      { type: 't-load', values: { r: 1000 } },
    ],
    { f0Hz: 1e6, ...settings },
  );

describe('VSWR and return loss against a chosen reference', () => {
  it('without a chosen reference there is no VSWR or return loss, only the mismatch', () => {
    const [n] = analyzeChain(kilohm(), opts).nodes;
    expect(n.referenceOhm).toBeNull();
    expect(n.vswr).toBeNull();
    expect(n.returnLossDb).toBeNull();
    expect(n.referenceLevelDbm).toBeNull();
    expect(n.mismatch).toBeCloseTo(1, 12); // matched to the 1 kΩ it really sees
  });

  it('a chain-wide 50 Ω reference gives VSWR 20 : 1 at the kilohm node', () => {
    const [n] = analyzeChain(kilohm({ referenceOhm: 50 }), opts).nodes;
    const gamma = (1000 - 50) / (1000 + 50);
    expect(n.referenceOhm).toBe(50);
    expect(n.vswr).toBeCloseTo((1 + gamma) / (1 - gamma), 9);
    expect(n.vswr).toBeCloseTo(20, 9);
    expect(n.returnLossDb).toBeCloseTo(-20 * Math.log10(gamma), 9);
  });

  it('a port reference (keyed by the stage the node follows) overrides the chain one', () => {
    const [n] = analyzeChain(
      kilohm({ referenceOhm: 50, portReferences: { s0: 1000 } }),
      opts,
    ).nodes;
    expect(n.referenceOhm).toBe(1000);
    expect(n.vswr).toBeCloseTo(1, 9);
    expect(n.returnLossDb).toBe(Infinity);
  });

  it('the level at the node in volts and as dBm across the reference', () => {
    const [n] = analyzeChain(kilohm({ portReferences: { s0: 600 } }), opts).nodes;
    const vPeak = 1e-3; // half the 2 mV EMF across the matched 1 kΩ load
    expect(n.vPeak).toBeCloseTo(vPeak, 15);
    expect(n.vRms).toBeCloseTo(vPeak / Math.SQRT2, 15);
    expect(n.referenceLevelDbm).toBeCloseTo(10 * Math.log10((vPeak * vPeak) / 2 / 600 / 1e-3), 9);
  });

  it('the swept input return loss follows the reference chosen for the chain input', () => {
    const sw = analyzeChain(kilohm({ referenceOhm: 50 }), opts).sweep!;
    const rl = -20 * Math.log10(950 / 1050);
    expect(sw.returnLossDb.every((v) => Math.abs(v - rl) < 1e-9)).toBe(true);
  });
});
