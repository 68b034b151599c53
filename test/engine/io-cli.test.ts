/**
 * The analysis CLI, run as a separate process on fixture chains: its outputs, its error
 * messages and its exit codes. Most runs use the esbuild bundle (what the benchmark times);
 * one runs the TypeScript source through tsx, as `npm run analyze` does.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { snapshotCli } from '../../scripts/bench/bundle-cli';
import { bundledCli } from './helpers/bundled-cli';
import { readTouchstone } from '../../shared/io/touchstone';
import type { AnalysisResult } from '../../shared/engine/types';

const ROOT = join(__dirname, '..', '..');
const FIXTURE = (name: string) => join(ROOT, 'test', 'fixtures', 'chains', name);
const built = bundledCli('cw-cli-');
const cli = built.run;

let broken: string;

beforeAll(() => {
  // Written here rather than kept as a fixture, so formatters never see invalid JSON.
  broken = join(built.dir, 'broken.json');
  writeFileSync(broken, '{\n  "name": "broken",\n  "settings": { "f0Hz": 7e6, }\n}\n');
});

describe('analyze CLI', () => {
  it('should say how long the analysis and the whole process took with --timing, output unchanged', () => {
    const plain = cli(FIXTURE('listener-7mhz.json'), '--sweep');
    const timed = cli(FIXTURE('listener-7mhz.json'), '--sweep', '--timing');
    expect(timed.code).toBe(0);
    expect(timed.out).toBe(plain.out);
    const seconds = (what: string) => {
      const m = new RegExp(`^timing: ${what} ([0-9.]+) s$`, 'm').exec(timed.err);
      expect(m).not.toBeNull();
      return Number(m![1]);
    };
    const solve = seconds('solve');
    const analysis = seconds('analysis');
    const whole = seconds('whole process');
    expect(solve).toBeGreaterThan(0);
    // The sweep's solve is a part of the analysis, and the analysis of the whole process.
    expect(solve).toBeLessThan(analysis);
    expect(analysis).toBeLessThan(whole);
  });

  it('should print the budget table with node columns, resonators and flags', () => {
    const { code, out, err } = cli(FIXTURE('listener-7mhz.json'));
    expect(err).toBe('');
    expect(code).toBe(0);
    const lines = out.split('\n');
    expect(lines[0]).toMatch(/^Chain "7 MHz listener: .*" at f0 = 7 MHz/);
    const header = lines.find((l) => l.startsWith('Node'))!;
    expect(header.trim().split(/\s+/)).toEqual(['Node', 'n0', 'n1', 'n2', 'n3']);
    for (const row of [
      'Zin toward load (Ω)',
      'Step-up |V|/|Es| (dB)',
      'Cumulative NF (dB)',
      'Cumulative IIP3 (dBm)',
      'Delivered (dBm)',
    ]) {
      const line = lines.find((l) => l.startsWith(row));
      expect(line).toBeDefined();
      // Aligned: every row of the node table is as long as the header row or shorter.
      expect([...line!].length).toBeLessThanOrEqual([...header].length);
    }
    expect(out).toMatch(/^Resonator .*Loaded Q .*BW .*Loading ratio/m);
    expect(out).toMatch(/^Flags$/m);
    // The fixture's amplifier input is meant to swamp the tank (a 2.6 kΩ input across it).
    expect(out).toMatch(/^ERROR \[tank-overloaded\] tank: /m);
  });

  it('should print the same analysis as JSON, with the sweep when asked', () => {
    const plain = cli(FIXTURE('listener-7mhz.json'), '--json');
    expect(plain.code).toBe(0);
    const result = JSON.parse(plain.out) as AnalysisResult;
    expect(result.f0Hz).toBe(7e6);
    expect(result.nodes).toHaveLength(4);
    expect(result.sweep).toBeUndefined();
    const swept = JSON.parse(
      cli(FIXTURE('listener-7mhz.json'), '--json', '--sweep').out,
    ) as AnalysisResult;
    expect(swept.sweep?.freqsHz).toHaveLength(201);
    expect(swept.nodes[3].stepUpDb).toBeCloseTo(result.nodes[3].stepUpDb, 12);
  });

  it('should print the sweep as a table with --sweep', () => {
    const { code, out } = cli(FIXTURE('listener-7mhz.json'), '--sweep');
    expect(code).toBe(0);
    const start = out.split('\n').findIndex((l) => l.startsWith('f (Hz)'));
    expect(start).toBeGreaterThan(0);
    expect(
      out
        .split('\n')
        .slice(start + 1)
        .filter((l) => /^\d/.test(l)),
    ).toHaveLength(201);
  });

  it('should write a long sweep through a pipe whole, and stop quietly when the reader leaves', () => {
    const doc = JSON.parse(readFileSync(FIXTURE('listener-7mhz.json'), 'utf8')) as {
      settings: { sweep: { points: number } };
    };
    doc.settings.sweep.points = 20_000; // about 3 MB of table: far more than a pipe holds
    const long = join(built.dir, 'long.json');
    writeFileSync(long, JSON.stringify(doc));
    const whole = spawnSync(process.execPath, [built.bundle, long, '--sweep'], {
      encoding: 'utf8',
      timeout: 30_000,
      maxBuffer: 1 << 26,
    });
    expect(whole.status).toBe(0);
    expect(whole.stdout.split('\n').filter((l) => /^\d/.test(l)).length).toBeGreaterThanOrEqual(
      20_000,
    );
    expect(whole.stdout.endsWith('\n')).toBe(true);
    const cut = spawnSync('bash', ['-c', `"${process.execPath}" "${built.bundle}" "${long}" --sweep | head -n 1`], {
      encoding: 'utf8',
      timeout: 30_000,
    }); // prettier-ignore
    expect(cut.stdout).toMatch(/^Chain "7 MHz listener/);
    expect(cut.stderr).toBe('');
  });

  it('should print an ngspice netlist with --spice', () => {
    const { code, out } = cli(FIXTURE('listener-7mhz.json'), '--spice');
    expect(code).toBe(0);
    expect(out.split('\n')[0]).toBe(
      'Chainwright chain "7 MHz listener: whip, link coils, tank, amplifier, detector"',
    );
    expect(out).toContain('ac lin 201 5000000 9000000');
    expect(out.trimEnd().endsWith('.end')).toBe(true);
  });

  it('should print Touchstone that the reader accepts, at the asked reference', () => {
    const { code, out } = cli(FIXTURE('listener-7mhz.json'), '--touchstone', '--z0', '75');
    expect(code).toBe(0);
    const file = readTouchstone(out, 'chain.s2p');
    expect(file.z0).toBe(75);
    expect(file.freqsHz.length).toBe(201);
  });

  it('should list stage types with parameters, units and defaults', () => {
    const { code, out } = cli('--list-types');
    expect(code).toBe(0);
    expect(out).toMatch(/^shunt-lc-tank {2}\[two-port, filter\]/m);
    expect(out).toMatch(/^ {4}l = 0\.000001 henry {2}Inductance$/m);
    const json = JSON.parse(cli('--list-types', '--json').out) as {
      type: string;
      params: unknown[];
    }[];
    expect(json.map((t) => t.type)).toContain('resistive-generator');
  });

  it('should exit 2 naming a missing file', () => {
    const { code, err, out } = cli(FIXTURE('no-such-chain.json'));
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/cannot read chain file .*no-such-chain\.json: no such file/);
  });

  it('should exit 2 with the line and column of bad JSON', () => {
    const { code, err } = cli(broken);
    expect(code).toBe(2);
    expect(err).toMatch(/broken\.json is not valid JSON at line 3, column 30/);
  });

  it('should exit 3 with one line per problem naming stage and parameter', () => {
    const { code, err } = cli(FIXTURE('invalid-values.json'));
    expect(code).toBe(3);
    const lines = err.trimEnd().split('\n');
    expect(lines[0]).toMatch(/invalid-values\.json: 2 problem\(s\) in the chain:$/);
    expect(lines[1]).toMatch(
      /^ {2}stages\[0\]\.values\.r: Stage 1 .*\(resistive-generator\): source resistance must be from 1 µΩ up to 1 TΩ/,
    );
    expect(lines[2]).toMatch(
      /^ {2}stages\[1\]\.values\.l: Stage 2 .*\(shunt-lc-tank\): inductance must be a number/,
    );
  });

  it('should exit 3 naming an unknown formatVersion', () => {
    const file = join(built.dir, 'future.json');
    const doc = JSON.parse(readFileSync(FIXTURE('listener-7mhz.json'), 'utf8')) as object;
    writeFileSync(file, JSON.stringify({ ...doc, formatVersion: 2 }));
    const { code, err } = cli(file);
    expect(code).toBe(3);
    expect(err).toMatch(/formatVersion: 2 is not a version this program reads \(it reads 1\)/);
  });

  it('should exit 4 naming the stage SPICE cannot express', () => {
    const { code, err } = cli(FIXTURE('with-mixer.json'), '--spice');
    expect(code).toBe(4);
    expect(err).toMatch(/Stage 2 "Mixer" \(mixer\) cannot be written as a SPICE netlist/);
  });

  it('should exit 1 on wrong usage', () => {
    expect(cli().code).toBe(1);
    expect(cli(broken, '--bogus').err).toMatch(/unknown option --bogus/);
    expect(cli(FIXTURE('listener-7mhz.json'), '--spice', '--touchstone').code).toBe(1);
    expect(cli(FIXTURE('listener-7mhz.json'), '--touchstone', '--z0', '-3').err).toMatch(
      /--z0 needs a resistance above 0/,
    );
  });

  it('should start from its start-up snapshot with the same output, options and exit codes', () => {
    const launcher = snapshotCli(built.bundle);
    const fromBlob = (...args: string[]) => {
      const p = spawnSync(launcher, args, {
        encoding: 'utf8',
        timeout: 30_000,
      });
      return { code: p.status, out: p.stdout, err: p.stderr };
    };
    for (const args of [['--sweep'], ['--json', '--plan'], ['--list-modes']]) {
      const want = cli(FIXTURE('listener-7mhz.json'), ...args);
      const got = fromBlob(FIXTURE('listener-7mhz.json'), ...args);
      expect(got).toEqual(want);
      expect(got.code).toBe(0);
    }
    expect(fromBlob(FIXTURE('no-such-chain.json')).code).toBe(2);
    expect(fromBlob('--list-types').out).toBe(cli('--list-types').out);
    expect(fromBlob(FIXTURE('listener-7mhz.json'), '--timing').err).toMatch(
      /^timing: solve [0-9.]+ s\ntiming: analysis /,
    );
    // Node warns about an extra CA file it cannot read; from the launcher it never reads one.
    const missing = join(built.dir, 'no-such-certificates.pem');
    const withCerts = (command: string, args: string[]) =>
      spawnSync(command, args, {
        encoding: 'utf8',
        timeout: 30_000,
        env: { ...process.env, NODE_EXTRA_CA_CERTS: missing },
      });
    expect(withCerts(process.execPath, ['-e', '0']).stderr).toContain(missing);
    const quiet = withCerts(launcher, [FIXTURE('listener-7mhz.json'), '--sweep']);
    expect(quiet.stderr).toBe('');
    expect(quiet.stdout).toBe(cli(FIXTURE('listener-7mhz.json'), '--sweep').out);
  });

  it('should run from the TypeScript source through tsx as npm run analyze does', () => {
    const p = spawnSync(
      process.execPath,
      [
        '--import',
        'tsx',
        join(ROOT, 'scripts', 'analyze.ts'),
        FIXTURE('listener-7mhz.json'),
        '--json',
      ],
      {
        encoding: 'utf8',
        timeout: 60_000,
        cwd: ROOT,
      },
    );
    expect(p.stderr).toBe('');
    expect(p.status).toBe(0);
    expect((JSON.parse(p.stdout) as AnalysisResult).nodes).toHaveLength(4);
  });
});
