/**
 * The switch contact, the branch to ground and the power amplifier against closed forms, the
 * trap judgement, and the band-switched shortwave input per band. Sources beside each check:
 * - a series impedance between two R0 ports: S21 = 2·R0/(2·R0 + Z); a shunt one:
 *   S21 = 2·Y0/(2·Y0 + Y) (two-port S-parameters of one element; Pozar, "Microwave
 *   Engineering", table 4.1 ABCD to S);
 * - parallel tank: the parallel equivalent of a coil of Q is ωL·(Q + 1/Q) across L(1 + 1/Q²),
 *   of a capacitor Q/(ωC) (series–parallel conversion, common practice);
 * - the load line R = V²peak/(2P) (Class-A/B load line; common practice).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain, ChainValidationError, insertStagesAfter } from '../../shared/engine';
import { matchHere } from '../../shared/engine/design/match-here';
import { offCapacitanceForIsolation } from '../../shared/engine/stages';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import type { ChainDocument } from '../../shared/schema/chain';

const TWO_PI = 2 * Math.PI;
const gen = (r = 50) => ({ id: 'gen', type: 'resistive-generator', values: { r, level: 'emf', emf: 1 } }); // prettier-ignore
const load = (r = 50) => ({ id: 'load', type: 'rc-load', values: { r, c: 0 } });
const chain = (middle: object[], f0 = 100e6, source: object = gen(), end: object = load()) =>
  parseChainDocument({
    name: 'stage test',
    settings: { f0Hz: f0, sweep: { startHz: f0 / 2, stopHz: f0 * 1.5, points: 201 } },
    stages: [source, ...middle, end],
  });
/** |S21|² in dB of the chain between 50 Ω ports: 20·log10(2·V_load/E). */
const s21Db = (doc: ChainDocument) => {
  const r = analyzeChain(doc, { sweep: false });
  return 20 * Math.log10(2 * r.nodes[r.nodes.length - 1].vPeak);
};
const sw = (values: object) => ({ id: 'sw', type: 'rf-switch', values });

describe('switch contact', () => {
  const f = 100e6;
  it('in series: closed is its on-resistance, open its off-capacitance (S21 closed forms)', () => {
    const closed = s21Db(chain([sw({ placement: 'series', state: 'on', ron: 2 })]));
    expect(closed).toBeCloseTo(20 * Math.log10(100 / 102), 9);
    const open = s21Db(chain([sw({ placement: 'series', state: 'off', coff: 0.5e-12 })]));
    const x = 1 / (TWO_PI * f * 0.5e-12);
    expect(open).toBeCloseTo(20 * Math.log10(100 / Math.hypot(100, x)), 9);
  });

  it('to ground: closed shorts the path through its on-resistance', () => {
    const closed = s21Db(chain([sw({ placement: 'shunt', state: 'on', ron: 1 })]));
    // S21 = 2·Y0/(2·Y0 + 1/Ron) with Y0 = 1/50.
    expect(closed).toBeCloseTo(20 * Math.log10(0.04 / (0.04 + 1)), 9);
    const open = s21Db(chain([sw({ placement: 'shunt', state: 'off', coff: 1e-12 })]));
    const b = TWO_PI * f * 1e-12;
    expect(open).toBeCloseTo(20 * Math.log10(0.04 / Math.hypot(0.04, b)), 9);
  });

  it('an isolation figure gives the off-capacitance that reproduces it at its frequency', () => {
    const doc = chain([sw({ placement: 'series', state: 'off', offGiven: 'isolation', isolationDb: 30, isolationHz: f, z0: 50 })]); // prettier-ignore
    expect(s21Db(doc)).toBeCloseTo(-30, 9);
    expect(offCapacitanceForIsolation(30, f, 50)).toBeCloseTo(1 / (TWO_PI * f * 100 * Math.sqrt(999)), 20); // prettier-ignore
  });

  it('a selector position closes only the contact set to it', () => {
    const at = (position: number) =>
      s21Db(chain([sw({ placement: 'series', control: 'position', position, closesAt: 2, ron: 1, coff: 0.1e-12 })])); // prettier-ignore
    expect(at(2)).toBeCloseTo(20 * Math.log10(100 / 101), 9);
    expect(at(1)).toBeLessThan(-20);
    expect(at(3)).toBeCloseTo(at(1), 12);
  });
});

describe('branch to ground', () => {
  const f0 = 100e6;
  const l = 100e-9;
  const c = 1 / ((TWO_PI * f0) ** 2 * l);
  const branch = (values: object) => ({ id: 'br', type: 'shunt-branch', label: 'Trap', values });

  it('a parallel tank to ground meant to block passes f0 and is judged, not called a tank', () => {
    const doc = chain([branch({ parts: `shunt C ${c}; series L ${l}`, end: 'ground', intent: 'block', ql: 100, qc: 1e12 })], f0); // prettier-ignore
    const r = analyzeChain(doc, { sweep: true });
    const trap = r.traps?.[0];
    // At ω²LC = 1: Y = jωC + 1/(ωL/Q + jωL) gives Z = ωL·(Q − j) exactly (Q = 100).
    const x = TWO_PI * f0 * l;
    expect(trap?.zBranch.re).toBeCloseTo(100 * x, 3);
    expect(trap?.zBranch.im).toBeCloseTo(-x, 3);
    expect(trap?.ratio).toBeCloseTo(Math.hypot(100 * x, x) / 50, 6);
    expect(trap?.ok).toBe(true);
    expect(r.flags.map((x) => x.code)).toEqual([]);
    expect(r.resonators).toEqual([]);
  });

  it('flags a block that does not reach its ratio, and a short that does not short', () => {
    const lowQ = chain([branch({ parts: `shunt C ${c}; series L ${l}`, end: 'ground', intent: 'block', ratio: 10, ql: 5 })], f0); // prettier-ignore
    const r = analyzeChain(lowQ, { sweep: false });
    // Q = 5: about ωL·5 = 314 Ω, only about 6× the 50 Ω it shunts.
    expect(r.traps?.[0].ratio).toBeLessThan(10);
    expect(r.flags.filter((x) => x.code === 'trap-missed').map((x) => x.stageId)).toEqual(['br']);
    expect(r.flags.find((x) => x.code === 'trap-missed')?.message).toMatch(/should block at f0/);
    const shortMissed = chain([branch({ parts: `series C ${c / 2}; series L ${l}`, end: 'ground', intent: 'short' })], f0); // prettier-ignore
    expect(analyzeChain(shortMissed, { sweep: false }).flags.map((x) => x.code)).toContain('trap-missed'); // prettier-ignore
    const shortOk = chain([branch({ parts: `series C ${c}; series L ${l}`, end: 'ground', intent: 'short' })], f0); // prettier-ignore
    expect(analyzeChain(shortOk, { sweep: false }).traps?.[0].ok).toBe(true);
  });

  it('a resonance a branch meant to block takes part in is judged as the trap, not as a tank', () => {
    const hiZ = (intent: string) =>
      chain([{ id: 'lx', type: 'lumped-element', values: { position: 'shunt', element: 'inductor', l } }, branch({ parts: `shunt C ${c}`, end: 'open', intent })], f0, gen(20e3), load(20e3)); // prettier-ignore
    // Judged as nothing in particular, the L and the branch's C are a tank the network shows.
    const plain = analyzeChain(hiZ('none'), { sweep: true });
    expect(plain.resonators.map((x) => [x.origin, x.partOf])).toEqual([['found', ['lx', 'br']]]);
    // Meant to block, the branch is judged by its own impedance (a bare C here: it misses).
    const judged = analyzeChain(hiZ('block'), { sweep: true });
    expect(judged.resonators).toEqual([]);
    expect(judged.flags.map((x) => x.code)).toEqual(['trap-missed']);
  });

  it('a shorted quarter-wave line is an open at f0 (Z = jZ0·tan βl)', () => {
    const len = 299_792_458 / f0 / 4; // vf 1
    const doc = chain([branch({ parts: `series line 50 ${len} 1`, end: 'ground', intent: 'block' })], f0); // prettier-ignore
    const z = analyzeChain(doc, { sweep: false }).traps?.[0].zBranch;
    expect(Math.abs(z?.im ?? 0)).toBeGreaterThan(1e9);
  });

  it('names the part at fault in its parts list', () => {
    const bad = (parts: string, end = 'open') => {
      try {
        analyzeChain(chain([branch({ parts, end })], f0));
      } catch (e) {
        if (e instanceof ChainValidationError) return e.issues[0];
      }
      throw new Error('expected a refusal');
    };
    expect(bad('shunt C 2.2p; across L 5n')).toMatchObject({ param: 'parts', message: expect.stringMatching(/part 2 \("across L 5n"\): start with "series"/) }); // prettier-ignore
    expect(bad('shunt C 2.2x')).toMatchObject({ message: expect.stringMatching(/part 1.*positive number/) }); // prettier-ignore
    expect(bad('shunt C 2.2p', 'ground').message).toMatch(/dead short to ground/);
  });
});

describe('power amplifier', () => {
  it('wants R = V²peak/(2P) and offers exactly P into it', () => {
    const pa = { id: 'pa', type: 'power-amplifier', values: { powerW: 0.5, swingFrom: 'supply', supplyV: 12, kneeV: 1 } }; // prettier-ignore
    const r = analyzeChain(chain([], 100e6, pa, load(121 / 1)), { sweep: false });
    // Vpeak = 11 V: R = 121/(2·0.5) = 121 Ω; into 121 Ω it delivers 0.5 W with 11 V peak.
    expect(r.nodes[0].zSrc.re).toBeCloseTo(121, 9);
    expect(r.nodes[0].deliveredW).toBeCloseTo(0.5, 9);
    expect(r.nodes[0].vPeak).toBeCloseTo(11, 9);
    expect(r.flags.filter((x) => x.code === 'caution').map((x) => x.data?.caution)).toEqual(['transmit', 'rf-exposure']); // prettier-ignore
  });
});

describe('power amplifier, match here in a transmit mode', () => {
  it("designs the L-section from the amplifier's load line to the antenna, in the mode's path", () => {
    const f0 = 433.92e6;
    const w = TWO_PI * f0;
    const pa = { id: 'pa', type: 'power-amplifier', values: { powerW: 0.1, supplyV: 3 } };
    const rxLoad = { id: 'rx-load', type: 'rc-load', values: { r: 200, c: 0 } };
    const doc = parseChainDocument({
      ...chain([], f0, gen(), rxLoad),
      stages: [gen(), rxLoad, pa, { id: 'ant', type: 'rc-load', values: { r: 50, c: 0 } }],
      modes: [
        { id: 'receive', name: 'Receive', kind: 'receive', path: ['gen', 'rx-load'] },
        { id: 'transmit', name: 'Transmit', kind: 'transmit', path: ['pa', 'ant'] },
      ],
    });
    const res = matchHere(doc, { afterStageId: 'pa' }, { mode: 'transmit' });
    expect(res.zSource.re).toBeCloseTo(45, 9); // 3²/(2·0.1)
    expect(res.zLoad.re).toBeCloseTo(50, 9);
    // Low-pass L from 45 Ω up to 50 Ω: Q = √(50/45 − 1), series X = 45·Q, shunt X = 50/Q.
    const q = Math.sqrt(50 / 45 - 1);
    const lowPass = res.candidates.find(
      (c) => c.topology === 'l-section' && c.parts[0].place === 'series' && c.parts[0].part === 'L',
    );
    expect(lowPass?.parts[0].value).toBeCloseTo((45 * q) / w, 18);
    expect(lowPass?.parts[1]).toMatchObject({ place: 'shunt', part: 'C' });
    expect(lowPass?.parts[1].value).toBeCloseTo(q / (50 * w), 20);
    expect(lowPass?.figures?.returnLossDb).toBeGreaterThan(30);
    // Inserted after the amplifier, the new stages join the transmit path only.
    const withMatch = insertStagesAfter(doc, 'pa', lowPass!.stages);
    const ids = lowPass!.stages.map((s) => s.id);
    expect(withMatch.modes?.[1].path).toEqual(['pa', ...ids, 'ant']);
    expect(withMatch.modes?.[0].path).toEqual(['gen', 'rx-load']);
    const tx = analyzeChain(withMatch, { mode: 'transmit', sweep: false }).transmit;
    expect(tx?.deliveredW).toBeGreaterThan(0.099);
  });
});

describe('band-switched shortwave input, per band', () => {
  const doc = parseChainDocument(
    JSON.parse(readFileSync(path.join(__dirname, '../../examples/shortwave-band-switched-input.chain.json'), 'utf8')), // prettier-ignore
  );
  const bands = [
    { mode: 'band-80', f0: 3.6e6, l: 4.7e-6, tank: 'tank-80' },
    { mode: 'band-40', f0: 7.1e6, l: 2.2e-6, tank: 'tank-40' },
  ];
  it.each(bands)(
    '$mode resonates at its centre with the loaded Q and step-up of its parts',
    (b) => {
      const r = analyzeChain(doc, { mode: b.mode, sweep: true });
      expect(r.mode?.id).toBe(b.mode);
      expect(r.f0Hz).toBe(b.f0);
      const c = doc.stages.find((s) => s.id === b.tank)!.values.c as number;
      const tank = r.resonators.find((x) => x.stageId === b.tank);
      expect(r.resonators.map((x) => x.stageId)).toEqual([b.tank]);
      // Closed forms: fr = 1/(2π√(L'C)) with the coil's parallel equivalent L' = L(1 + 1/Q²).
      const fr = 1 / (TWO_PI * Math.sqrt(b.l * (1 + 1 / 150 ** 2) * c));
      expect((tank?.resonanceHz ?? 0) / fr).toBeCloseTo(1, 4);
      const w = TWO_PI * b.f0;
      const rp = 1 / (1 / (w * b.l * (150 + 1 / 150)) + (w * c) / 1000 + 1 / 10e3);
      const rs = 100 * 51; // 50 Ω + 1 Ω contact, through 1:10
      const total = 1 / (1 / rp + 1 / rs);
      expect((tank?.loadedQ ?? 0) / (total / (w * b.l * (1 + 1 / 150 ** 2)))).toBeCloseTo(1, 2);
      // Step-up at f0 from the EMF to the tank: 10·Rp/(Rs + Rp).
      const node = r.nodes[r.nodes.length - 1];
      expect(node.stepUp / ((10 * rp) / (rs + rp))).toBeCloseTo(1, 2);
      expect(r.flags).toEqual([]);
    },
  );
});
