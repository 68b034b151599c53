/**
 * Noise at the impedances really there: a noise figure stated for one source resistance and
 * driven from another is flagged (VSWR between the rated and the actual source above the
 * chain's threshold); noise parameters compute the real figure; noise temperatures stand
 * beside every noise figure.
 *
 * Independent references, computed here and not read from the engine:
 * - VSWR of a real load R against a real reference R0 is max(R, R0)/min(R, R0) (definition
 *   of VSWR for resistive terminations; common practice).
 * - Noise figure at source admittance Ys from noise parameters:
 *   F = Fmin + (Rn/Gs)·|Ys − Yopt|² (H. A. Haus et al., "Representation of noise in linear
 *   twoports", Proc. IRE 48, 1960; the same form in Pozar, "Microwave Engineering", noise
 *   chapter; from memory).
 * - Effective input noise temperature Te = T0·(F − 1), T0 = 290 K (IEEE Std 161 definition).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { bundleCli } from '../../scripts/bench/bundle-cli';
import { analyzeChain } from '../../shared/engine';
import type { AnalysisResult } from '../../shared/engine/types';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const ROOT = join(__dirname, '..', '..');
const FIXTURE = join(ROOT, 'test', 'fixtures', 'chains', 'lna-noise-mismatch.json');
const fixture = (): ChainDocument => parseChainDocument(JSON.parse(readFileSync(FIXTURE, 'utf8')));
const db10 = (x: number) => 10 * Math.log10(x);

/** Noise factor from noise parameters at a real source resistance (Haus et al.). */
function noiseFactor(fminDb: number, rn: number, ropt: number, rs: number): number {
  const gs = 1 / rs;
  const yopt = 1 / ropt;
  return 10 ** (fminDb / 10) + (rn / gs) * (gs - yopt) ** 2;
}

describe('a 50 Ω-rated LNA driven from a 5 kΩ source', () => {
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'cw-noise-'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('the analyze CLI (--json) flags the noise mismatch on the LNA with VSWR 100', async () => {
    const bundle = await bundleCli(join(dir, 'analyze.js'));
    const p = spawnSync(process.execPath, [bundle, FIXTURE, '--json'], {
      encoding: 'utf8',
      timeout: 30_000,
    });
    expect(p.stderr).toBe('');
    expect(p.status).toBe(0);
    const res = JSON.parse(p.stdout) as AnalysisResult;
    const flags = res.flags.filter((f) => f.stageId === 'a' && f.code === 'noise-mismatch');
    expect(flags).toHaveLength(1);
    const expectedVswr = 5000 / 50; // real terminations: VSWR = R_high / R_low
    expect(flags[0].data!.vswr as number).toBeCloseTo(expectedVswr, 9);
    expect(flags[0].data!.ratedSourceOhm).toBe(50);
    expect(flags[0].message).toMatch(/stated for a 50 Ω source .* driven from 5 kΩ/);
  });

  it('its noise-parameter twin (Fmin 1 dB, Rn 10 Ω, optimum 50 Ω) gives 13.19 dB, unflagged', () => {
    const doc = fixture();
    Object.assign(doc.stages[1].values, {
      noiseMode: 'parameters',
      fminDb: 1,
      rn: 10,
      ropt: 50,
      xopt: 0,
    });
    const res = analyzeChain(doc);
    const expected = db10(noiseFactor(1, 10, 50, 5000));
    expect(expected).toBeCloseTo(13.19, 2); // the value the reproducer states
    expect(res.levels.noiseFigureDb).toBeCloseTo(expected, 9);
    expect(res.levels.correlationNoiseFigureDb).toBeCloseTo(expected, 6);
    expect(res.flags.filter((f) => f.code === 'noise-mismatch')).toEqual([]);
  });

  it('driven from the 50 Ω it was rated at, the figure holds and nothing is flagged', () => {
    const doc = fixture();
    doc.stages[0].values.r = 50;
    const res = analyzeChain(doc);
    expect(res.levels.noiseFigureDb).toBeCloseTo(1, 9);
    expect(res.flags.filter((f) => f.code === 'noise-mismatch')).toEqual([]);
  });

  it('the VSWR threshold is the chain setting (default 2)', () => {
    const doc = fixture();
    doc.stages[0].values.r = 90; // VSWR 1.8
    expect(analyzeChain(doc).flags.map((f) => f.code)).not.toContain('noise-mismatch');
    doc.settings.thresholds.noiseMismatchVswr = 1.5;
    const flags = analyzeChain(doc).flags.filter((f) => f.code === 'noise-mismatch');
    expect(flags.map((f) => f.data!.vswr as number)).toEqual([expect.closeTo(90 / 50, 9)]);
  });

  it('a figure stated at another source resistance is judged against that one', () => {
    const doc = fixture();
    Object.assign(doc.stages[1].values, { nfSource: 'stated', nfSourceR: 4000 });
    const res = analyzeChain(doc); // 5 kΩ against 4 kΩ: VSWR 1.25
    expect(res.flags.filter((f) => f.code === 'noise-mismatch')).toEqual([]);
  });
});

describe('noise temperature beside every noise figure', () => {
  it('per stage, cumulative, at the output and for the system referred to the antenna', () => {
    const doc = fixture();
    doc.stages[0].values.r = 50;
    doc.settings.sourceNoiseTemperatureK = 1000; // a warm sky seen by the antenna
    const res = analyzeChain(doc);
    const te = 290 * (10 ** 0.1 - 1); // Te = T0·(F − 1), NF 1 dB
    expect(te).toBeCloseTo(75.088, 3);
    const st = res.stages[0];
    expect(st.noiseTemperatureK).toBeCloseTo(te, 9);
    expect(st.cumulativeNoiseTemperatureK).toBeCloseTo(te, 9);
    // 20 dB stated gain into a matched 50 Ω load: the output carries G·(Ts + Te).
    expect(st.outputNoiseTemperatureK).toBeCloseTo(100 * (1000 + te), 6);
    expect(res.levels.noiseTemperatureK).toBeCloseTo(te, 9);
    expect(res.levels.systemNoiseTemperatureK).toBeCloseTo(1000 + te, 9);
    // The floor is k·Tsys·B over the 10 kHz default channel.
    const floor = 10 * Math.log10((1.380649e-23 * (1000 + te) * 10e3) / 1e-3);
    expect(res.levels.noiseFloorDbm).toBeCloseTo(floor, 9);
  });
});
