/**
 * Tuning across a band: a two-gang tuner (signal tank and oscillator) with a trimmer on each
 * section and a padder in the oscillator, designed in the test by the three-point tracking
 * rule (see helpers/three-point-tracking.ts for the sources). The study must show the
 * tracking error the closed forms give at every dial position, crossing zero at the three
 * tracking points and nowhere else.
 */
import { bandSpecSchema } from '../../shared/schema/studies';
import { runBandStudy } from '../../shared/engine/studies';
import { superhetFrontEnd, singleTank } from './helpers/study-chains';
import { oscHz, sectionFor, signalHz, threePointDesign } from './helpers/three-point-tracking';

const IF = 455e3;
const RF = { l: 230e-6, trimmer: 15e-12 };
const GANG = { min: 12e-12, max: 365e-12 };
const [FA, FB] = [600e3, 1600e3];
const FM = (FA + FB) / 2;
const H = ((FB - FA) / 2) * (Math.sqrt(3) / 2);
const TRACK: [number, number, number] = [FM - H, FM, FM + H];
const OSC = threePointDesign(RF, IF, TRACK);

jest.setTimeout(120_000);

describe('band study: two-gang superhet tuner with padder', () => {
  const spec = bandSpecSchema.parse({
    kind: 'band',
    gang: [{ stageId: 'tank', key: 'c', ...GANG }],
    positions: 41,
    oscillator: { l: OSC.l, trimmer: OSC.trimmer, padder: OSC.padder },
    points: 101,
  });
  const result = runBandStudy({ doc: superhetFrontEnd(RF, 100e-12) }, spec);
  const tank = result.circuits.findIndex((c) => c.stageId === 'tank');

  it('the designed oscillator tracks exactly at the three chosen points', () => {
    for (const f of TRACK) {
      const s = sectionFor(f, RF);
      expect(oscHz(s, OSC) - IF).toBeCloseTo(signalHz(s, RF), 3);
    }
  });

  it('states the dial, LO and tracking error the closed forms give at every position', () => {
    expect(result.positions).toHaveLength(41);
    for (const p of result.positions) {
      const s = GANG.min + p.dial * (GANG.max - GANG.min);
      const lo = oscHz(s, OSC);
      expect(p.loHz!).toBeCloseTo(lo, 3);
      expect(p.dialHz).toBeCloseTo(lo - IF, 3);
      expect(p.resonanceHz[tank]! / signalHz(s, RF)).toBeCloseTo(1, 8);
      expect(p.trackingErrorHz[tank]!).toBeCloseTo(signalHz(s, RF) - (lo - IF), 0);
    }
  });

  it('the error crosses zero once near each tracking point and nowhere else', () => {
    const errs = result.positions.map((p) => p.trackingErrorHz[tank]!);
    const dials = result.positions.map((p) => p.dialHz);
    const crossings: number[] = [];
    for (let k = 0; k + 1 < errs.length; k++) {
      if (Math.sign(errs[k]) !== Math.sign(errs[k + 1])) {
        // Interpolate the dial frequency of the zero.
        crossings.push(dials[k] + ((dials[k + 1] - dials[k]) * errs[k]) / (errs[k] - errs[k + 1]));
      }
    }
    const inBand = crossings.filter((f) => f > 560e3 && f < 1700e3).sort((a, b) => a - b);
    expect(inBand).toHaveLength(3);
    inBand.forEach((f, i) => expect(Math.abs(f / TRACK[i] - 1)).toBeLessThan(0.01));
  });

  it('flags a position where the tank mistracks by more than half its bandwidth', () => {
    for (const p of result.positions) {
      const bw = p.bandwidthHz[tank]!;
      expect(p.mistracked[tank]).toBe(Math.abs(p.trackingErrorHz[tank]!) > 0.5 * bw);
    }
    expect(result.mistrackedPositions).toBe(
      result.positions.filter((p) => p.mistracked[tank]).length,
    );
    expect(result.positions.every((p) => p.imageRejectionDb !== null)).toBe(true);
  });
});

describe('band study without an oscillator', () => {
  it('reads the dial from the first member and finds it resonating there', () => {
    const doc = singleTank({ l: 10e-6, c: 100e-12, points: 101 });
    const spec = bandSpecSchema.parse({
      kind: 'band',
      gang: [{ stageId: 'tank', key: 'c', min: 50e-12, max: 200e-12 }],
      positions: 5,
    });
    const result = runBandStudy({ doc }, spec);
    result.positions.forEach((p) => {
      const c = 50e-12 + p.dial * 150e-12;
      expect(p.dialHz / (1 / (2 * Math.PI * Math.sqrt(10e-6 * c)))).toBeCloseTo(1, 8);
      expect(p.trackingErrorHz[0]!).toBeCloseTo(0, 0);
    });
  });

  it('says what is wrong with a gang member that has no value', () => {
    const doc = singleTank({ l: 10e-6, c: 100e-12, points: 101 });
    const spec = bandSpecSchema.parse({
      kind: 'band',
      gang: [{ stageId: 'nowhere', key: 'c', min: 50e-12, max: 200e-12 }],
      positions: 5,
    });
    expect(() => runBandStudy({ doc }, spec)).toThrow(/no stage "nowhere"/);
  });
});

describe('band study from the chain’s own variable marks', () => {
  const marked = (variables: unknown) => {
    const doc = singleTank({ l: 10e-6, c: 100e-12, points: 101 });
    return { ...doc, settings: { ...doc.settings, variables } } as typeof doc;
  };

  it('turns the gang marked on the chain exactly as the same gang listed in the study', () => {
    const gang = [{ stageId: 'tank', key: 'c', min: 50e-12, max: 200e-12 }];
    const fromMarks = runBandStudy(
      { doc: marked(gang) },
      bandSpecSchema.parse({ kind: 'band', positions: 5 }),
    );
    const listed = runBandStudy(
      { doc: singleTank({ l: 10e-6, c: 100e-12, points: 101 }) },
      bandSpecSchema.parse({ kind: 'band', gang, positions: 5 }),
    );
    expect(fromMarks.positions.map((p) => p.dialHz)).toEqual(listed.positions.map((p) => p.dialHz));
    // Thomson's formula at each end of the marked range (common practice).
    expect(fromMarks.positions[0].dialHz * 2 * Math.PI * Math.sqrt(10e-6 * 50e-12)).toBeCloseTo(1, 8); // prettier-ignore
  });

  it('picks a named gang group, and a study’s own gang overrides the marks', () => {
    const doc = marked([
      { stageId: 'tank', key: 'c', min: 50e-12, max: 200e-12 },
      { stageId: 'tank', key: 'c', min: 90e-12, max: 110e-12, gang: 'bandspread' },
    ]);
    const spread = runBandStudy({ doc }, bandSpecSchema.parse({ kind: 'band', positions: 3, gangGroup: 'bandspread' })); // prettier-ignore
    const c = (p: { dial: number }) => 90e-12 + p.dial * 20e-12;
    spread.positions.forEach((p) => expect(p.dialHz * 2 * Math.PI * Math.sqrt(10e-6 * c(p))).toBeCloseTo(1, 8)); // prettier-ignore
    const own = runBandStudy({ doc }, bandSpecSchema.parse({ kind: 'band', positions: 3, gang: [{ stageId: 'tank', key: 'c', min: 150e-12, max: 160e-12 }] })); // prettier-ignore
    expect(own.positions[0].dialHz * 2 * Math.PI * Math.sqrt(10e-6 * 150e-12)).toBeCloseTo(1, 8);
  });

  it('says how to mark a gang when the chain has none and the study lists none', () => {
    const doc = singleTank({ l: 10e-6, c: 100e-12, points: 101 });
    expect(() =>
      runBandStudy({ doc }, bandSpecSchema.parse({ kind: 'band', positions: 3 })),
    ).toThrow(/no variable value: mark a tuning capacitor/);
  });
});
