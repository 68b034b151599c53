/**
 * The whole analysis: every field of the result filled for a superheterodyne front end,
 * stages after the mixer evaluated at the IF, the sweep option, the default catalogue and
 * the public API, and the node analysis's reused workspace and blocks of points.
 */
import {
  analyzeChain,
  buildChain,
  catalogue,
  createNodeAnalysis,
  ENGINE_VERSION,
  frequencyGrid,
  getStageDefinition,
  runNodeAnalysis,
  STAGE_DEFINITIONS,
  validateChain,
} from '../../shared/engine';
import { BLOCK } from '../../shared/engine/core/nodes';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const opts = { catalogue: TEST_CATALOGUE };
const tankAt = (f: number, l: number, label: string): StageInput => ({
  type: 't-tank',
  label,
  values: { l, c: 1 / ((2 * Math.PI * f) ** 2 * l), rs: (2 * Math.PI * f * l) / 150 },
});

describe('analyzeChain on a superheterodyne front end', () => {
  // Our own demo scenario: 1 MHz signal, LO 1.455 MHz, 455 kHz IF tank, detector load.
  const doc = chain(
    [
      { type: 't-source', label: 'Antenna', values: { rs: 20e3, emf: 50e-6 } },
      tankAt(1e6, 100e-6, 'Preselector'),
      { type: 't-amp', label: 'RF amp', values: { rin: 20e3, rout: 20e3, gm: 0.01, nf: 4, iip3: -5, p1db: -15 } }, // prettier-ignore
      { type: 't-mixer', label: 'Mixer', values: { lo: 1.455e6, rin: 10e3, rout: 50e3 } },
      tankAt(455e3, 200e-6, 'IF tank'),
      { type: 't-load', label: 'Detector', values: { r: 100e3 } },
    ],
    { f0Hz: 1e6, offsetsHz: [10e3], channelBandwidthHz: 5e3, referenceOhm: 50 },
  );
  const res = analyzeChain(doc, opts);

  it('fills every part of the result', () => {
    expect(res.engineVersion).toBe(ENGINE_VERSION);
    expect(res.f0Hz).toBe(1e6);
    expect(res.nodes.map((n) => n.after)).toEqual(['Antenna', 'Preselector', 'RF amp', 'Mixer', 'IF tank']); // prettier-ignore
    expect(res.stages.map((s) => [s.fromNode, s.toNode])).toEqual([[0, 1], [1, 2], [2, 3], [3, 4]]); // prettier-ignore
    for (const n of res.nodes) {
      for (const v of [
        n.vPeak,
        n.stepUp,
        n.deliveredW,
        n.availableW,
        n.mismatch,
        n.returnLossDb,
        n.vswr,
        n.referenceLevelDbm,
      ]) {
        expect(Number.isFinite(v)).toBe(true);
      }
      expect(n.vRms).toBeCloseTo(n.vPeak / Math.SQRT2, 15);
    }
    for (const s of res.stages) {
      expect(Number.isFinite(s.availableGainDb + s.noiseFigureDb + s.cumulativeNoiseFigureDb)).toBe(true); // prettier-ignore
    }
    expect(res.resonators).toHaveLength(2);
    expect(res.selectivity).toHaveLength(5);
    expect(Object.values(res.levels).every((v) => v === null || Number.isFinite(v))).toBe(true);
    expect(res.sweep?.freqsHz).toHaveLength(2001);
    expect(res.sweep?.nodes).toHaveLength(5);
  });

  it('evaluates the stages after the mixer at the IF', () => {
    expect(res.stages[2]).toMatchObject({ fInHz: 1e6 });
    expect(res.stages[2].fOutHz).toBeCloseTo(455e3, 6);
    expect(res.stages[3].fInHz).toBeCloseTo(455e3, 6);
    const ifTank = res.resonators[1];
    expect(ifTank.node).toBe(4);
    expect(Math.abs((ifTank.resonanceHz as number) / 455e3 - 1)).toBeLessThan(1e-3);
    expect(res.selectivity[4].imageHz).toBeCloseTo(1.91e6, 3);
  });

  it('finds the IF tank through a high-side LO, where the IF falls as the input rises', () => {
    // A narrow RF sweep leaves the image out, so only the signal-side crossing is in range.
    const narrow = { ...doc, settings: { ...doc.settings, sweep: { startHz: 0.95e6, stopHz: 1.05e6, points: 201, scale: 'lin' as const } } }; // prettier-ignore
    const ifTank = analyzeChain(narrow, opts).resonators[1];
    expect(Math.abs((ifTank.resonanceHz as number) / 455e3 - 1)).toBeLessThan(1e-3);
    expect(ifTank.loadedQ).toBeCloseTo(res.resonators[1].loadedQ as number, 6);
  });

  it('keeps stage and cumulative figures consistent', () => {
    let sum = 0;
    res.stages.forEach((s) => {
      sum += s.voltageGainDb;
      expect(s.cumulativeVoltageGainDb).toBeCloseTo(sum, 9);
    });
    const g = res.stages.reduce((a, s) => a + s.availableGainDb, 0);
    expect(res.levels.totalGainDb).toBeCloseTo(g, 9);
    // the available power at each stage input follows the available gains
    expect(res.stages[1].inputLevelDbm).toBeCloseTo(res.levels.inputAvailableDbm + res.stages[0].availableGainDb, 9); // prettier-ignore
  });

  it('leaves the sweep out when asked', () => {
    const lean = analyzeChain(doc, { ...opts, sweep: false });
    expect(lean.sweep).toBeUndefined();
    expect(lean.selectivity[1].bw3dbHz).toBe(res.selectivity[1].bw3dbHz);
  });
});

describe('reports at a matched termination', () => {
  it('50 Ω into 50 Ω: transducer gain 0 dB, mismatch 1, VSWR 1, return loss infinite', () => {
    const [n] = analyzeChain(chain([{ type: 't-source' }, { type: 't-load' }], { f0Hz: 1e6, referenceOhm: 50 }), opts).nodes; // prettier-ignore
    expect(n.transducerGainDb).toBeCloseTo(0, 12);
    expect(n.mismatch).toBeCloseTo(1, 12);
    expect(n.vswr).toBeCloseTo(1, 12);
    expect(n.returnLossDb).toBe(Infinity);
    expect(n.stepUpDb).toBeCloseTo(-6.0206, 4); // half the EMF across a matched load
  });
});

describe('public API and the default catalogue', () => {
  it('catalogue() strips the builders; getStageDefinition finds by type', () => {
    const info = catalogue();
    expect(info).toHaveLength(STAGE_DEFINITIONS.length);
    expect(info.every((d) => !('build' in d))).toBe(true);
    expect(getStageDefinition(STAGE_DEFINITIONS[0].type)).toBe(STAGE_DEFINITIONS[0]);
    expect(getStageDefinition('no-such-type')).toBeUndefined();
  });

  it('analyzes with the product catalogue by default', () => {
    const source = STAGE_DEFINITIONS.find((d) => d.role === 'source');
    const load = STAGE_DEFINITIONS.find((d) => d.role === 'load');
    expect(source && load).toBeTruthy();
    const doc = parseChainDocument({
      name: 'defaults',
      settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 2e6, points: 11, scale: 'lin' as const } }, // prettier-ignore
      stages: [
        { id: 'a', type: source!.type, values: {} },
        { id: 'b', type: load!.type, values: {} },
      ],
    });
    expect(analyzeChain(doc).nodes).toHaveLength(1);
    expect(validateChain(doc)).toEqual([]);
    expect(
      validateChain({ ...doc, stages: [doc.stages[1], doc.stages[0]] }).length,
    ).toBeGreaterThan(0);
  });
});

describe('with the product catalogue', () => {
  it('derives the image of the catalogue mixer from its frequency translation', () => {
    // Our own scenario: 1 MHz preselector, mixer set to a 455 kHz IF with a high-side LO.
    const doc = parseChainDocument({
      name: 'catalogue superhet',
      settings: { f0Hz: 1e6, sweep: { startHz: 0.5e6, stopHz: 2.5e6, points: 401, scale: 'lin' as const } }, // prettier-ignore
      stages: [
        { id: 'src', type: 'resistive-generator', values: {} },
        { id: 'pre', type: 'shunt-lc-tank', values: { l: 100e-6, c: 253.3e-12 } },
        { id: 'mix', type: 'mixer', values: { loSource: 'from-if', ifHz: 455e3, side: 'high' } },
        { id: 'ld', type: 'rc-load', values: {} },
      ],
    });
    const res = analyzeChain(doc);
    expect(res.stages[1].fOutHz).toBeCloseTo(455e3, 3);
    expect(res.selectivity[2].imageHz).toBeCloseTo(1.91e6, 3);
    expect(res.selectivity[1].imageRejectionDb as number).toBeGreaterThan(0);
    expect(Math.abs((res.resonators[0].resonanceHz as number) / 1e6 - 1)).toBeLessThan(2e-3);
  });
});

describe('hot path', () => {
  // Speed is measured by `npm run bench`, never asserted here; these check what the fast
  // path must keep: a reused workspace, and blocks of points that join without a seam.
  it('a reused workspace gives the numbers of a fresh run, across block boundaries', () => {
    const mid: StageInput[] = [];
    for (let i = 0; i < 6; i++) mid.push(tankAt(1e6, 100e-6, `T${i}`), { type: 't-series', values: { r: 5, l: 1e-6 } }); // prettier-ignore
    const built = buildChain(chain([{ type: 't-source' }, ...mid, { type: 't-load' }], { f0Hz: 1e6 }), TEST_CATALOGUE); // prettier-ignore
    const f = frequencyGrid(built.settings.sweep);
    expect(f.length % BLOCK).not.toBe(0); // the last block is a short one
    const ws = createNodeAnalysis(built, f.length);
    runNodeAnalysis(
      built,
      f.map((x) => x * 1.5),
      ws,
    ); // leave other numbers behind
    const reused = runNodeAnalysis(built, f, ws);
    expect(reused).toBe(ws);
    const fresh = runNodeAnalysis(built, f);
    for (const key of ['zinRe', 'zinIm', 'zsrcRe', 'zsrcIm', 'vRe', 'vIm', 'fNode'] as const) {
      expect(Array.from(reused[key])).toEqual(Array.from(fresh[key]));
    }
    // Each point alone (a block of one) agrees with the same point inside a block.
    const one = createNodeAnalysis(built, 1);
    for (const i of [0, BLOCK - 1, BLOCK, f.length - 1]) {
      runNodeAnalysis(built, [f[i]], one);
      for (let node = 0; node < fresh.nodes; node++) {
        expect(one.vRe[node]).toBe(fresh.vRe[node * fresh.points + i]);
        expect(one.zinIm[node]).toBe(fresh.zinIm[node * fresh.points + i]);
      }
    }
  });
});
