/**
 * Flags: each code raised by a chain built to trigger it, with its severity, the stage id
 * and a sentence with the numbers; and left alone when the chain is fine.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine/analyze';
import type { BuiltStage } from '../../shared/engine/core/build';
import { buildChain } from '../../shared/engine/core/build';
import { runNodeAnalysis } from '../../shared/engine/core/nodes';
import { judgedForQ, qBudget } from '../../shared/engine/core/q-budget';
import { availablePower, deliveredPower } from '../../shared/engine/core/quantities';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { TwoPortModel } from '../../shared/engine/types';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import type { Flag } from '../../shared/engine/types';
import { chain, TEST_CATALOGUE, type StageInput } from './core-fixtures';

const run = (stages: StageInput[], settings: Parameters<typeof chain>[1]) =>
  analyzeChain(chain(stages, settings), { catalogue: TEST_CATALOGUE, sweep: false });
const only = (flags: Flag[], code: Flag['code']) => flags.filter((f) => f.code === code);

describe('tank-overloaded', () => {
  // 1 mH coil tuned to 77.5 kHz (ωL = 487 Ω), coil Q about 300, fed from 100 kΩ, then a detector
  const f0 = 77.5e3;
  const l = 1e-3;
  const c = 1 / ((2 * Math.PI * f0) ** 2 * l);
  const stages = (detectorOhms: number): StageInput[] => [
    { type: 't-source', values: { rs: 100e3 } },
    { type: 't-tank', label: 'Loop tank', values: { l, c, rs: 1.62 } },
    { type: 't-shunt-r', label: 'Envelope detector', values: { r: detectorOhms } },
    { type: 't-load', values: { mode: 'open' } },
  ];

  it('is an error below the error ratio, naming the stage, worded with Q, bandwidth and the damping share', () => {
    const res = run(stages(10e3), { f0Hz: f0 });
    const [flag] = only(res.flags, 'tank-overloaded');
    const r = res.resonators[0];
    expect(flag).toMatchObject({ severity: 'error', stageId: 's1' });
    expect(r.loadingRatio as number).toBeLessThan(0.2);
    expect(flag.message).toMatch(
      /^Tank "Loop tank" at 77\.5 kHz: Q falls from \d+ to \d+(\.\d)? \(ratio 0\.\d+\) when "Envelope detector" is attached; bandwidth widens from \d+(\.\d+)? Hz to \d+(\.\d+)? kHz\. The downstream side takes \d+ % of the damping\. Rule: a ratio below 0\.5 \(as shown, to two decimals\) is a warning, below 0\.2 an error; 0\.50 is a conjugate match\.$/,
    );
    expect(flag.data).toMatchObject({ loadedQ: r.loadedQ, detachedQ: r.detachedQ, loadingRatio: r.loadingRatio }); // prettier-ignore
  });

  it('is a warning between the thresholds, and absent when the load is light', () => {
    const mid = run(stages(10e3), { f0Hz: f0, thresholds: { loadingWarn: 0.5, loadingError: 0.1, compressionBackoffDb: 3, matchReturnLossDb: 15, detuneFraction: 0.5 } }); // prettier-ignore
    expect(only(mid.flags, 'tank-overloaded')[0].severity).toBe('warning');
    const light = run(stages(10e6), { f0Hz: f0 });
    expect(only(light.flags, 'tank-overloaded')).toEqual([]);
    expect(light.resonators[0].loadingRatio as number).toBeGreaterThan(0.9);
  });
});

describe('a conjugately matched tank (loading ratio 0.5)', () => {
  // A lossless tank between equal resistances: detached Q = R/(ωL), loaded Q = (R/2)/(ωL), so
  // the ratio is 0.5 exactly (common practice); rounding either way must not flip the verdict.
  const l = 10e-6;
  const c = 1 / ((2 * Math.PI * 1e6) ** 2 * l);
  const run2 = (rLoad: number) =>
    run([{ type: 't-source', values: { rs: 5000 } }, { type: 't-tank', label: 'Tank', values: { l, c } }, { type: 't-shunt-r', label: 'Next stage', values: { r: rLoad } }, { type: 't-load', values: { mode: 'open' } }], { f0Hz: 1e6 }); // prettier-ignore

  it.each([5000 * (1 - 1e-9), 5000, 5000 * (1 + 1e-9)])(
    'is reported as matched, not overloaded, with %d Ω downstream',
    (r) => {
      // prettier-ignore
      const res = run2(r);
      expect(res.resonators[0].loadingRatio as number).toBeCloseTo(0.5, 6);
      expect(only(res.flags, 'tank-overloaded')).toEqual([]);
      const [flag] = only(res.flags, 'tank-matched');
      expect(flag.severity).toBe('info');
      expect(flag.message).toMatch(/That is a conjugate match \(ratio 0\.50\)/);
      expect(flag.message).toMatch(
        /Rule: a ratio below 0\.5 \(as shown, to two decimals\) is a warning/,
      );
    },
  );

  it('is a warning once the ratio shows 0.49', () => {
    const res = run2(4800); // ratio 4800/9800 = 0.4898
    expect(only(res.flags, 'tank-overloaded')[0].severity).toBe('warning');
    expect(only(res.flags, 'tank-matched')).toEqual([]);
  });
});

describe('tank-detuned', () => {
  it('flags a tank tuned 5 % off f0 when its bandwidth is 1 %', () => {
    const l = 100e-6;
    const fr = 1.05e6;
    const c = 1 / ((2 * Math.PI * fr) ** 2 * l);
    const rs = 100 * 2 * Math.PI * fr * l; // loaded Q = 100
    const res = run(
      [{ type: 't-source', values: { rs } }, { type: 't-tank', values: { l, c } }, { type: 't-load', values: { mode: 'open' } }], // prettier-ignore
      { f0Hz: 1e6 },
    );
    const [flag] = only(res.flags, 'tank-detuned');
    expect(flag.severity).toBe('warning');
    expect(flag.message).toMatch(/resonates at 1\.05 MHz, 50 kHz above the design frequency 1 MHz: 4\.8 bandwidths away \(its bandwidth is 10\.5 kHz; limit 0\.\d+ bandwidths\)/); // prettier-ignore
  });
});

describe('stage flags', () => {
  const match = (r: number, qreq = 1): StageInput => ({ type: 't-match', label: 'Match', values: { r, qreq, qpart: 100 } }); // prettier-ignore

  it('match-missed when the designed match shows a return loss below the threshold', () => {
    const bad = run([{ type: 't-source' }, match(50), { type: 't-load' }], { f0Hz: 1e6 });
    const [flag] = only(bad.flags, 'match-missed');
    // Zin = 100 Ω against 50 Ω: |Γ| = 1/3, return loss 9.54 dB (common practice)
    expect(flag.message).toMatch(
      /input return loss at 1 MHz is 9\.54 dB \(wanted at least 15 dB\)/,
    );
    const good = run([{ type: 't-source' }, match(0), { type: 't-load' }], { f0Hz: 1e6 });
    expect(only(good.flags, 'match-missed')).toEqual([]);
  });

  it('q-budget when the design needs more Q than the parts have', () => {
    const res = run([{ type: 't-source' }, match(0, 250), { type: 't-load' }], { f0Hz: 1e6 });
    expect(only(res.flags, 'q-budget')[0].message).toMatch(/needs a loaded Q of 250 but its parts have Q 100/); // prettier-ignore
  });

  it('caution: a high-voltage stage carries the usual caution, deferring to codes and licensed practice', () => {
    const res = run([{ type: 't-source' }, match(0), { type: 't-load' }], { f0Hz: 1e6 });
    const [flag] = only(res.flags, 'caution');
    expect(flag).toMatchObject({ severity: 'info', stageId: 's1' });
    expect(flag.message).toMatch(/local electrical codes and licensed practice/);
  });

  it('compression: warning inside the back-off, error past P1dB', () => {
    const amp = { type: 't-amp', label: 'LNA', values: { rin: 50, p1db: -5 } };
    // available input = Es²/(8·50 Ω): −6 dBm needs Es = sqrt(0.4·10^−0.6) V peak
    const near = run([{ type: 't-source', values: { emf: Math.sqrt(0.4 * Math.pow(10, -0.6)) } }, amp, { type: 't-load' }], { f0Hz: 1e6 }); // prettier-ignore
    const [w] = only(near.flags, 'compression');
    expect(w.severity).toBe('warning');
    expect(w.message).toBe('"LNA" is driven at -6 dBm available, within 1 dB of its -5 dBm 1 dB compression point (back-off wanted: 3 dB).'); // prettier-ignore
    const over = run([{ type: 't-source', values: { emf: 1 } }, amp, { type: 't-load' }], { f0Hz: 1e6 }); // prettier-ignore
    expect(only(over.flags, 'compression')[0].severity).toBe('error');
    const quiet = run([{ type: 't-source', values: { emf: 1e-3 } }, amp, { type: 't-load' }], { f0Hz: 1e6 }); // prettier-ignore
    expect(only(quiet.flags, 'compression')).toEqual([]);
  });

  it('detector-underdriven when the detector input is below its working level', () => {
    const det = { type: 't-shunt-r', label: 'Detector', values: { r: 50, vmin: 0.1 } };
    const res = run([{ type: 't-source', values: { emf: 0.02 } }, det, { type: 't-load', values: { mode: 'open' } }], { f0Hz: 1e6 }); // prettier-ignore
    // 0.02 V EMF into 50 Ω from 50 Ω: 10 mV peak, 7.07 mV rms
    expect(only(res.flags, 'detector-underdriven')[0].message).toBe(
      '"Detector" gets 10 mV peak (7.07 mV rms) at 1 MHz, below the 100 mV peak it needs to work properly; add gain or step the voltage up before it.',
    );
    const ok = run([{ type: 't-source', values: { emf: 1 } }, det, { type: 't-load', values: { mode: 'open' } }], { f0Hz: 1e6 }); // prettier-ignore
    expect(only(ok.flags, 'detector-underdriven')).toEqual([]);
  });

  it('detector-underdriven also for a detector that is the last stage (a load)', () => {
    const res = run([{ type: 't-source', values: { emf: 0.02 } }, { type: 't-detector-load', label: 'Diode', values: { vmin: 0.1 } }], { f0Hz: 1e6 }); // prettier-ignore
    const [flag] = only(res.flags, 'detector-underdriven');
    expect(flag.stageId).toBe('s1');
    expect(flag.message).toMatch(/^"Diode" gets 10 mV peak/);
  });
});

describe('the q-budget of a well-matched stage', () => {
  it('skips the lossless rebuild only where the available power bounds the loss under the limit', () => {
    // The two-metre example's match: about 0.1 dB between the source side's available power
    // and what the stage delivers, so no part Q can make it lose more than that.
    const raw = JSON.parse(
      readFileSync(
        path.join(__dirname, '../../examples/two-metre-coupled-preselector.chain.json'),
        'utf8',
      ),
    );
    const { variantOf: _v, ...doc } = raw;
    const built = buildChain(parseChainDocument(doc), STAGE_DEFINITIONS);
    const f0Na = runNodeAnalysis(built, [built.settings.f0Hz]);
    const stage = built.twoPorts.find((s) => s.id === 'match')!;
    expect(judgedForQ(stage)).toBe(true);
    const bound =
      10 *
      Math.log10(
        availablePower(f0Na, stage.firstSection, 0) /
          deliveredPower(f0Na, stage.firstSection + stage.sectionCount, 0),
      );
    expect(bound).toBeGreaterThan(0);
    // Below the bound the loss is worked out, and it is within the bound; above it, nothing.
    const judged = qBudget(built, f0Na, stage as BuiltStage<TwoPortModel>, bound / 100);
    expect(judged).not.toBeNull();
    expect(judged!.lossDb).toBeGreaterThan(0);
    expect(judged!.lossDb).toBeLessThanOrEqual(bound * (1 + 1e-9));
    expect(qBudget(built, f0Na, stage as BuiltStage<TwoPortModel>, bound * 1.001)).toBeNull();
  });
});
