/**
 * Amplifier sign convention: common-emitter/source (and grounded-cathode) stages invert,
 * common-base/gate stages and stated-gain blocks do not; the SPICE writer follows the same
 * convention.
 *
 * The reference is ngspice (Debian) run on netlists written BY HAND here, not by the
 * writer: a hybrid-π style stage, the collector current gm·v_be drawn out of the output
 * node (inverting) or pushed into it (non-inverting) by a voltage-controlled current
 * source. A closed form checks the same numbers: V_out/V_in = ∓gm / (1/Rout + 1/RL + jωCout)
 * (small-signal hybrid-π model; e.g. Sedra and Smith, "Microelectronic Circuits", common
 * emitter chapter; from memory).
 */
import { analyzeChain, catalogue, type ParamValues } from '../../shared/engine';
import { chainToSpice } from '../../shared/engine/spice/netlist';
import { acControl, runAc, vectorAt } from './helpers/ngspice';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const RS = 50;
const RIN = 2600;
const CIN = 25e-12;
const ROUT = 5000;
const COUT = 4e-12;
const GM = 0.0385;
const RL = 5000;
const FREQS = [1e6, 2e6, 3e6];

/** The chain the engine analyses: generator → amplifier (by gm) → R load. */
function chainDoc(polarity: 'inverting' | 'non-inverting', extra: Record<string, unknown> = {}) {
  return parseChainDocument({
    name: `amplifier phase, ${polarity}`,
    settings: { f0Hz: 2e6, sweep: { startHz: 1e6, stopHz: 3e6, points: 3, scale: 'lin' as const } }, // prettier-ignore
    stages: [
      { id: 'g', type: 'resistive-generator', values: { r: RS, level: 'emf', emf: 1 } },
      {
        id: 'a',
        type: 'unilateral-amplifier',
        values: { rin: RIN, cin: CIN, rout: ROUT, cout: COUT, gainMode: 'gm', gm: GM, polarity, ...extra }, // prettier-ignore
      },
      { id: 'l', type: 'rc-load', values: { r: RL, c: 0 } },
    ],
  });
}

/** Hand-written netlist of the same stage. `inverting` decides the G element's direction. */
function handNetlist(inverting: boolean): string {
  // G n+ n- c+ c- gm: a current gm·V(c+, c-) flows from n+ through the source to n-.
  // Inverting: the device draws gm·v_in out of the output node to ground.
  const g = inverting ? `G1 out 0 in 0 ${GM}` : `G1 0 out in 0 ${GM}`;
  return [
    '* amplifier phase check, written by hand',
    'V1 src 0 DC 0 AC 1',
    `RS src in ${RS}`,
    `RIN in 0 ${RIN}`,
    `CIN in 0 ${CIN}`,
    g,
    `ROUT out 0 ${ROUT}`,
    `COUT out 0 ${COUT}`,
    `RL out 0 ${RL}`,
    ...acControl('ac lin 3 1meg 3meg', ['v(in)', 'v(out)']),
    '.end',
  ].join('\n');
}

const phaseDeg = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;
/** Difference of two phases, wrapped to (−180, 180]. */
const wrap = (d: number) => {
  const x = ((((d + 180) % 360) + 360) % 360) - 180;
  return x === -180 ? 180 : x;
};

/** Closed-form phase of V_out/V_in (degrees). */
function closedFormPhase(f: number, inverting: boolean): number {
  const gOut = 1 / ROUT + 1 / RL;
  const b = 2 * Math.PI * f * COUT;
  // (∓gm)/(gOut + jb) = ∓gm·(gOut − jb)/(gOut² + b²)
  const s = inverting ? -GM : GM;
  return phaseDeg(s * gOut, -s * b);
}

describe.each([
  ['inverting', true],
  ['non-inverting', false],
] as const)('the %s stage', (polarity, inverting) => {
  const res = analyzeChain(chainDoc(polarity));
  const sw = res.sweep!;
  const engineShift = FREQS.map((_, i) => wrap(sw.nodes[1].phaseDeg[i] - sw.nodes[0].phaseDeg[i]));

  it('shifts the phase as ngspice does on a hand-written netlist', () => {
    const table = runAc(handNetlist(inverting));
    FREQS.forEach((f, i) => {
      expect(table.freqsHz[i]).toBeCloseTo(f, 3);
      const vin = vectorAt(table, 'v(in)', i);
      const vout = vectorAt(table, 'v(out)', i);
      const spiceShift = wrap(phaseDeg(...vout) - phaseDeg(...vin));
      expect(Math.abs(wrap(engineShift[i] - spiceShift))).toBeLessThan(1e-6);
    });
  });

  it('matches the closed form, near 180° when inverting and near 0° when not', () => {
    FREQS.forEach((f, i) => {
      expect(Math.abs(wrap(engineShift[i] - closedFormPhase(f, inverting)))).toBeLessThan(1e-9);
      expect(Math.abs(engineShift[i])).toBeLessThan(inverting ? 180 : 15);
      expect(Math.abs(engineShift[i])).toBeGreaterThan(inverting ? 165 : 0);
    });
  });

  it('is written to SPICE with the same convention', () => {
    const netlist = chainToSpice(chainDoc(polarity));
    const g = netlist.split('\n').find((l) => /^G/.test(l))!;
    const [, nPlus, nMinus] = g.split(/\s+/);
    // Inverting: from the output node (n2... of the writer) to ground; else the reverse.
    expect(inverting ? nMinus : nPlus).toBe('0');
  });
});

describe('presets and stated-gain blocks', () => {
  const shiftOf = (stageValues: ParamValues) => {
    const doc = chainDoc('inverting');
    doc.stages[1].values = stageValues;
    const sw = analyzeChain(doc).sweep!;
    return wrap(sw.nodes[1].phaseDeg[0] - sw.nodes[0].phaseDeg[0]);
  };
  const presetValues = (key: string) => {
    const def = catalogue().find((d) => d.type === 'unilateral-amplifier')!;
    return def.presets!.find((p) => p.key === key)!.values;
  };

  it.each([
    ['common-emitter', 180],
    ['common-source', 180],
    ['cascode', 180],
    ['common-base', 0],
    ['common-gate', 0],
  ])('the %s preset shifts the phase by about %i°', (key, expected) => {
    expect(Math.abs(wrap(shiftOf(presetValues(key)) - expected))).toBeLessThan(10);
  });

  it('a stated-gain block does not invert, whatever its phase setting', () => {
    const shift = shiftOf({ rin: RIN, rout: ROUT, cin: 0, cout: 0, gainMode: 'stated', gainDb: 20, polarity: 'inverting' }); // prettier-ignore
    expect(Math.abs(shift)).toBeLessThan(1e-9);
  });
});
