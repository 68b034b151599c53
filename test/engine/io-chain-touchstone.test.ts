/**
 * Touchstone export of a whole chain, read back with the reader and checked against
 * ngspice (Debian package ngspice), run in the test on the chain terminated in the
 * reference resistance at both ends: then S21 = 2·V(load)/Es and S11 = (Zin − z0)/(Zin + z0)
 * (standard definitions for equal real references).
 */
import { chainToSpiceDeck } from '../../shared/engine/spice/netlist';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { StageDefinition } from '../../shared/engine/types';
import { sToAbcd } from '../../shared/engine/core/abcd';
import { measuredTwoPort } from '../../shared/engine/stages';
import {
  chainNetwork,
  chainToTouchstone,
  TouchstoneExportError,
} from '../../shared/io/chain-touchstone';
import { toMeasuredNetwork } from '../../shared/io/network-data';
import { writeTouchstone } from '../../shared/io/touchstone-writer';
import { readTouchstone } from '../../shared/io/touchstone';
import type { ChainDocument, ChainDocumentInput } from '../../shared/schema/chain';
import { runAc, vectorAt } from './helpers/ngspice';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const catalogue = STAGE_DEFINITIONS;

function terminated(z0: number, middle: ChainDocumentInput['stages']): ChainDocument {
  return parseChainDocument({
    name: `pi and T between ${z0} ohm terminations`,
    settings: { f0Hz: 10e6, sweep: { startHz: 1e6, stopHz: 30e6, points: 201, scale: 'lin' } },
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: z0, level: 'emf', emf: 1 } },
      ...middle,
      { id: 'load', type: 'rc-load', values: { r: z0, c: 0 } },
    ],
  });
}

const MIDDLE: ChainDocumentInput['stages'] = [
  { id: 'pi', type: 'pi-match', values: { mode: 'design', r1: 1000, r2: 50, q: 10 } },
  { id: 'tank', type: 'shunt-lc-tank', values: { l: 1e-6, ql: 80, c: 253.3e-12, qc: 600 } },
  { id: 't', type: 't-match', values: { mode: 'design', r1: 50, r2: 10, q: 3 } },
];

describe('Touchstone of a whole chain', () => {
  it.each([50, 75])('should match ngspice S11 and S21 at reference %d Ω', (z0) => {
    const doc = terminated(z0, MIDDLE);
    const file = readTouchstone(chainToTouchstone(doc, { z0, catalogue }), 'chain.s2p');
    expect(file.z0).toBe(z0);
    expect(file.freqsHz.length).toBe(201);
    const deck = chainToSpiceDeck(doc, { catalogue });
    const spice = runAc(deck.netlist, deck.dataFile);
    const last = deck.nodeVectors.get(deck.nodeCount - 1)!;
    let worst = 0;
    for (let i = 0; i < 201; i++) {
      expect(Math.abs(spice.freqsHz[i] - file.freqsHz[i]) / file.freqsHz[i]).toBeLessThan(1e-11);
      const [vre, vim] = vectorAt(spice, last, i);
      const [s21re, s21im] = [file.s[8 * i + 4], file.s[8 * i + 5]];
      worst = Math.max(worst, Math.hypot(s21re - 2 * vre, s21im - 2 * vim));
      const [v0re, v0im] = vectorAt(spice, 'v(n0)', i);
      const [ire, iim] = vectorAt(spice, deck.sourceCurrent, i).map((v) => -v);
      const d = ire * ire + iim * iim;
      const [zre, zim] = [(v0re * ire + v0im * iim) / d, (v0im * ire - v0re * iim) / d];
      const dd = (zre + z0) ** 2 + zim ** 2;
      const s11re = ((zre - z0) * (zre + z0) + zim * zim) / dd;
      const s11im = (zim * (zre + z0) - (zre - z0) * zim) / dd;
      worst = Math.max(worst, Math.hypot(file.s[8 * i] - s11re, file.s[8 * i + 1] - s11im));
    }
    // Touchstone keeps 12 significant digits; ngspice prints 15.
    expect(worst).toBeLessThan(1e-8);
  });

  it('should round-trip chain → Touchstone → measured two-port with the same ABCD at every point', () => {
    // Round-trip identity: the catalogue's measured-two-port reads the exported file back
    // (through the contract's MeasuredNetwork form) and must give the chain's own cascade.
    const doc = terminated(50, MIDDLE);
    const net = chainNetwork(doc, { catalogue });
    const file = readTouchstone(writeTouchstone(net, { format: 'MA', unit: 'MHz' }), 'rt.s2p');
    const abcdOf = measuredTwoPort(toMeasuredNetwork(file));
    const cascaded = sToAbcd(net.s, 50);
    const got = new Float64Array(8);
    let worst = 0;
    file.freqsHz.forEach((f, i) => {
      abcdOf(f, got, 0);
      for (let k = 0; k < 8; k += 2) {
        const [re, im] = [cascaded[8 * i + k], cascaded[8 * i + k + 1]];
        const scale = Math.max(1e-12, Math.hypot(re, im));
        worst = Math.max(worst, Math.hypot(got[k] - re, got[k + 1] - im) / scale);
      }
    });
    expect(worst).toBeLessThan(1e-7);
  });

  it('should label the file with the chain and the reference', () => {
    const text = chainToTouchstone(terminated(50, MIDDLE), {
      catalogue,
      unit: 'MHz',
      format: 'DB',
    });
    const lines = text.split('\n');
    expect(lines[0]).toBe('! Chainwright chain "pi and T between 50 ohm terminations"');
    expect(lines).toContain('# MHZ S DB R 50');
    expect(lines.filter((l) => /^[0-9]/.test(l))).toHaveLength(201);
  });

  it('should refuse a chain with a stage that changes the frequency, naming it', () => {
    const shifter: StageDefinition = {
      type: 'test-shifter',
      category: 'mixer',
      role: 'two-port',
      label: 'Test shifter',
      summary: 'Defined by this test.',
      params: [],
      build: () => ({
        sections: [
          {
            abcd: (_f, out, o) => out.set([1, 0, 0, 0, 0, 0, 1, 0], o),
            translate: (f) => Math.abs(f - 1e6),
          },
        ],
      }),
    };
    const doc = terminated(50, [
      { id: 'mix', type: 'test-shifter', label: 'Converter', values: {} },
    ]);
    expect(() => chainToTouchstone(doc, { catalogue: [...catalogue, shifter] })).toThrow(
      TouchstoneExportError,
    );
    expect(() => chainToTouchstone(doc, { catalogue: [...catalogue, shifter] })).toThrow(
      /^Stage 2 "Converter" \(test-shifter\) changes the frequency/,
    );
  });
});
