/**
 * Whole chains of several stages: the engine's sweep (analyzeChain) against ngspice's AC
 * analysis of the chain's generated netlist, every node voltage (dB and degrees relative to
 * the source EMF) and the input impedance, at 0.01 dB and 0.1° over ≥ 201 points.
 * Reference: ngspice (Debian package ngspice), run in the test. The chains are scenarios of
 * our own.
 */
import {
  acGrid,
  chainToSpice,
  chainToSpiceDeck,
  SpiceExportError,
} from '../../shared/engine/spice/netlist';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { StageDefinition } from '../../shared/engine/types';
import type { ChainDocument, ChainDocumentInput, StageInstance } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { AGREEMENT, expectAgreement } from './helpers/compare';
import { runAc } from './helpers/ngspice';

const catalogue = STAGE_DEFINITIONS;

type Stage = StageInstance;
const stage = (id: string, type: string, values: Stage['values'] = {}, label = ''): Stage => ({
  id,
  type,
  label,
  values,
});
const lin = (startHz: number, stopHz: number, points: number) => ({
  startHz,
  stopHz,
  points,
  scale: 'lin' as const,
});

const CHAIN_INPUTS: ChainDocumentInput[] = [
  {
    name: 'Whip, coupled coils, tank, amplifier and detector for a 7 MHz listener',
    settings: { f0Hz: 7e6, sweep: lin(5e6, 9e6, 401) },
    stages: [
      stage('ant', 'short-monopole', { height: 1.5, diameter: 1.5e-3, lossR: 3 }, 'Whip'),
      stage('cpl', 'coupled-coils', { l1: 1e-6, l2: 10e-6, k: 0.3, q1: 80, q2: 150 }, 'Link coils'),
      stage('tank', 'shunt-lc-tank', { l: 10e-6, ql: 150, c: 51.7e-12, qc: 800 }, 'Tuned tank'),
      stage('amp', 'unilateral-amplifier', { rin: 2600, cin: 25e-12, gm: 0.0385 }, 'RF amplifier'),
      stage('det', 'envelope-detector', { rLoad: 47e3, c: 4e-12 }, 'Detector'),
    ],
  },
  {
    name: '75 Ω feed through an L-match to a 1 kΩ tank and an ADC input',
    settings: { f0Hz: 10.7e6, sweep: lin(8e6, 13e6, 501) },
    stages: [
      stage('src', 'resistive-generator', { r: 75, level: 'emf', emf: 0.01 }, 'Feed'),
      stage(
        'lm',
        'l-match',
        { orientation: 'series-l-shunt-c', mode: 'design', r1: 75, r2: 1000 },
        '75→1k',
      ),
      stage('tank', 'shunt-lc-tank', { l: 2.2e-6, ql: 90, c: 100.6e-12, qc: 500 }, 'Tank'),
      stage('adc', 'adc-input', { r: 1000, c: 5e-12 }, 'ADC'),
    ],
  },
  {
    name: 'Pi, T, feeder, pad and a series trap, into 50 Ω',
    settings: { f0Hz: 10e6, sweep: lin(1e6, 40e6, 781) },
    stages: [
      stage('src', 'resistive-generator', { r: 1000, level: 'emf', emf: 1 }, 'High-Z source'),
      stage('pi', 'pi-match', { mode: 'design', r1: 1000, r2: 50, q: 10 }, 'Pi'),
      stage('t', 't-match', { mode: 'design', r1: 50, r2: 10, q: 3 }, 'T'),
      stage('line', 'transmission-line', { z0: 50, length: 3, vf: 0.66 }, 'Feeder'),
      stage('pad', 'attenuator-pad', { db: 3, z0: 50, form: 't' }, '3 dB pad'),
      stage('trap', 'series-lc', { l: 4.7e-6, ql: 60, c: 10.8e-12, qc: 900 }, 'Series trap'),
      stage('load', 'rc-load', { r: 50, c: 0 }, 'Termination'),
    ],
  },
  {
    name: 'Capacitor-coupled tapped-C match, capacitive tap and transformer to an earpiece',
    settings: { f0Hz: 3.5e6, sweep: lin(1e6, 8e6, 351) },
    stages: [
      stage('src', 'resistive-generator', { r: 600, level: 'emf', emf: 0.5 }, 'Generator'),
      stage(
        'cc',
        'lumped-element',
        { position: 'series', element: 'capacitor', c: 220e-12, qc: 2000 },
        'Coupling C',
      ),
      stage('tcm', 'tapped-c-match', { mode: 'design', r1: 5000, r2: 600, q: 8 }, 'Tapped C'),
      stage('tap', 'capacitive-tap', { c1: 150e-12, c2: 1.2e-9, direction: 'step-down' }, 'C tap'),
      stage('xf', 'ideal-transformer', { n: 0.25 }, 'Step-up transformer'),
      stage('ear', 'earphone-high-z', { r: 4000, c: 2e-9 }, 'Earpiece'),
    ],
  },
  {
    name: 'Two-resonator bandpass, T/R switch and a triode stage into an ADC',
    settings: { f0Hz: 10e6, sweep: lin(7e6, 13e6, 601) },
    stages: [
      stage('src', 'resistive-generator', { r: 50, level: 'emf', emf: 1e-3 }, 'Antenna port'),
      stage(
        'sw',
        'tr-switch',
        { insertionLossDb: 0.6, isolationDb: 45, state: 'receive', z0: 50 },
        'T/R',
      ),
      stage(
        'bp',
        'coupled-bandpass',
        { coupling: 'top-c', l: 1e-6, c: 250e-12, cc: 8.2e-12 },
        'Preselector',
      ),
      stage('v1', 'triode-amplifier', { gm: 0.004, rout: 12e3 }, 'Triode'),
      stage('adc', 'adc-input', { r: 1000, c: 5e-12 }, 'ADC'),
    ],
  },
  {
    name: 'Double L, tapped coil and a shunt resistor into low-impedance phones',
    settings: { f0Hz: 1.8e6, sweep: lin(0.5e6, 4e6, 351) },
    stages: [
      stage('src', 'resistive-generator', { r: 50, level: 'power', powerDbm: -60 }, 'Signal'),
      stage(
        'dl',
        'double-l-match',
        { form: 'step-up', mode: 'design', r1: 50, r2: 2000 },
        'Two L sections',
      ),
      stage(
        'tc',
        'tapped-coil',
        { l: 20e-6, tap: 0.3, k: 0.95, q: 120, direction: 'step-down' },
        'Tapped coil',
      ),
      stage(
        'rsh',
        'lumped-element',
        { position: 'shunt', element: 'resistor', r: 330 },
        'Swamping R',
      ),
      stage(
        'ser',
        'lumped-element',
        { position: 'series', element: 'inductor', l: 3.3e-6, ql: 40, esr: 0 },
        'Choke',
      ),
      stage('hp', 'headphone-low-z', { r: 32, l: 50e-6 }, 'Phones'),
    ],
  },
];

const CHAINS: ChainDocument[] = CHAIN_INPUTS.map((c) => parseChainDocument(c));

describe('whole chains against ngspice', () => {
  it.each(CHAINS.map((c) => [c.name, c] as const))('should agree for "%s"', (_name, doc) => {
    const a = expectAgreement(doc, catalogue);
    expect(a.exactGrid).toBe(true);
    expect(a.points).toBeGreaterThanOrEqual(201);
    expect(a.nodes).toBe(doc.stages.length - 1);
    expect(a.worstDb.dbError).toBeLessThanOrEqual(AGREEMENT.db);
    expect(a.worstDeg.degError).toBeLessThanOrEqual(AGREEMENT.deg);
  });

  it('should run the engine on ngspice grid when a log sweep is not whole points per decade', () => {
    const doc = parseChainDocument({
      ...CHAINS[1],
      settings: {
        f0Hz: 10.7e6,
        sweep: { startHz: 1e6, stopHz: 3e7, points: 257, scale: 'log' },
      },
    });
    const deck = chainToSpiceDeck(doc, { catalogue });
    expect(deck.exactGrid).toBe(false);
    expect(deck.acLine).toMatch(/^ac dec \d+ 1000000 30000000$/);
    const spice = runAc(deck.netlist, deck.dataFile);
    expect(spice.freqsHz.length).toBe(deck.freqsHz.length);
    spice.freqsHz.forEach((f, i) => expect(Math.abs(f - deck.freqsHz[i]) / f).toBeLessThan(1e-12));
    const a = expectAgreement(doc, catalogue);
    expect(a.exactGrid).toBe(false);
    expect(a.points).toBeGreaterThanOrEqual(201);
  });
});

describe('the comparison itself', () => {
  it('should fail, naming the worst point, when a stage netlist differs from its model', () => {
    // A test-only stage: the model is a 50 Ω series resistor, its SPICE lines say 51 Ω.
    const mislabelled: StageDefinition = {
      type: 'test-mislabelled-resistor',
      category: 'element',
      role: 'two-port',
      label: 'Mislabelled resistor',
      summary: 'Defined by this test.',
      params: [],
      build: () => ({
        sections: [{ abcd: (_f, out, o) => out.set([1, 0, 50, 0, 0, 0, 1, 0], o) }],
        spice: (a, b, prefix) => [`R${prefix} ${a} ${b} 51`],
      }),
    };
    const doc = parseChainDocument({
      name: 'mislabelled',
      settings: { f0Hz: 1e6, sweep: lin(1e5, 1e7, 201) },
      stages: [
        stage('src', 'resistive-generator', { r: 50, level: 'emf', emf: 1 }),
        stage('bad', mislabelled.type),
        stage('load', 'rc-load', { r: 50, c: 0 }),
      ],
    });
    expect(() => expectAgreement(doc, [...catalogue, mislabelled])).toThrow(
      /engine and ngspice disagree for "mislabelled":\n {2}worst dB at [0-9.e+]+ Hz, (node 1|Zin)/,
    );
  });
});

describe('the netlist as an export', () => {
  const netlist = chainToSpice(CHAINS[2], { catalogue });

  it('should start with a title naming the chain and label every stage in a comment', () => {
    const lines = netlist.split('\n');
    expect(lines[0]).toBe('Chainwright chain "Pi, T, feeder, pad and a series trap, into 50 Ω"');
    expect(netlist).toContain('* Stage 1 "High-Z source" (resistive-generator): source, drives n0');
    expect(netlist).toContain('* Stage 3 "T" (t-match): n1 -> n2');
    expect(netlist).toContain('* Stage 7 "Termination" (rc-load): load, n5 to ground');
    expect(lines).toContain('ac lin 781 1000000 40000000');
    expect(lines).toContain('wrdata chain-ac.txt v(n0) v(n1) v(n2) v(n3) v(n4) v(n5) i(Vs0)');
    expect(lines[lines.length - 2]).toBe('.end');
  });

  it('should refuse a stage with no SPICE form, naming it', () => {
    const doc: ChainDocument = {
      ...CHAINS[0],
      stages: [
        stage('meas', 'measured-antenna', {}, 'Measured whip'),
        ...CHAINS[0].stages.slice(1),
      ],
    };
    expect(() => chainToSpice(doc, { catalogue })).toThrow(SpiceExportError);
    expect(() => chainToSpice(doc, { catalogue })).toThrow(
      /^Stage 1 "Measured whip" \(measured-antenna\) cannot be written as a SPICE netlist/,
    );
  });

  it('should refuse a mixer, naming it', () => {
    const doc: ChainDocument = {
      ...CHAINS[1],
      stages: [
        ...CHAINS[1].stages.slice(0, 3),
        stage('mix', 'mixer', {}, 'First mixer'),
        ...CHAINS[1].stages.slice(3),
      ],
    };
    expect(() => chainToSpice(doc, { catalogue })).toThrow(SpiceExportError);
    expect(() => chainToSpice(doc, { catalogue })).toThrow(
      /^Stage 4 "First mixer" \(mixer\) cannot be written as a SPICE netlist/,
    );
  });

  it('should refuse a lossy transmission line (its √f loss has no exact SPICE element)', () => {
    const doc: ChainDocument = {
      ...CHAINS[2],
      stages: CHAINS[2].stages.map((s) =>
        s.id === 'line' ? { ...s, values: { ...s.values, lossDbPerM: 0.05 } } : s,
      ),
    };
    expect(() => chainToSpice(doc, { catalogue })).toThrow(
      /^Stage 4 "Feeder" \(transmission-line\) cannot be written as a SPICE netlist/,
    );
  });

  it('should refuse a probe node the chain does not have', () => {
    expect(() => chainToSpice(CHAINS[2], { catalogue, probeNodes: [0, 9] })).toThrow(
      /probe node 9 is not a node of this chain \(0\.\.5\)/,
    );
  });

  it('should write whole points per decade as an exact dec grid', () => {
    const grid = acGrid({ startHz: 1e4, stopHz: 1e9, points: 301, scale: 'log' });
    expect(grid).toMatchObject({ acLine: 'ac dec 60 10000 1000000000', exact: true });
    expect(grid.freqsHz.length).toBe(301);
    expect(grid.freqsHz[300] / 1e9).toBeCloseTo(1, 12);
  });

  it('should find a whole points-per-decade count that gives a log sweep of less than a decade', () => {
    // 1 to 3 MHz is 0.477 decades: 420 per decade makes floor(200.39) = 200 intervals.
    const grid = acGrid({ startHz: 1e6, stopHz: 3e6, points: 201, scale: 'log' });
    expect(grid).toMatchObject({ acLine: 'ac dec 420 1000000 3000000', exact: true });
    expect(grid.freqsHz.length).toBe(201);
  });
});
