/**
 * The CLI's `--sweep-only`, run as a separate process from its esbuild bundle: the sweep
 * alone, as a table and as JSON, must be what `--sweep` writes after its budget table, byte
 * for byte and value for value, in any mode; its timing lines must nest; and the options it
 * cannot honour must be refused with what to leave out.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SWEEP_CHUNK } from '../../shared/engine';
import { benchChain } from '../../scripts/bench/bench-chain';
import { bundledCli } from './helpers/bundled-cli';

const ROOT = join(__dirname, '..', '..');
const FIXTURE = (name: string) => join(ROOT, 'test', 'fixtures', 'chains', name);
const EXAMPLE = (key: string) => join(ROOT, 'examples', `${key}.chain.json`);
const bundled = bundledCli('cw-cli-sweep-');
const cli = bundled.run;

/** What `--sweep` writes after its budget table and its "Sweep" line. */
function sweepTableOf(out: string): string {
  const at = out.indexOf('\nSweep\n');
  expect(at).toBeGreaterThan(0);
  return out.slice(at + '\nSweep\n'.length);
}

describe('analyze CLI --sweep-only', () => {
  it.each([
    ['a chain without modes', FIXTURE('listener-7mhz.json'), []],
    ['a chain through a mixer', FIXTURE('with-mixer.json'), []],
    ['a mode of a chain with modes', EXAMPLE('ism-433-transceiver-shared-antenna'), ['--mode', 'transmit']], // prettier-ignore
  ])('should write the table --sweep writes, and nothing else, for %s', (_what, file, mode) => {
    const alone = cli(file, '--sweep-only', ...mode);
    expect(alone.err).toBe('');
    expect(alone.code).toBe(0);
    const withAnalysis = cli(file, '--sweep', ...mode);
    expect(withAnalysis.code).toBe(0);
    expect(alone.out).toBe(sweepTableOf(withAnalysis.out));
    expect(alone.out.split('\n')[0]).toMatch(/^f \(Hz\)\s+n0 \(dB\)/);
  });

  it('should write the table --sweep writes for a sweep it solves and writes in several chunks', () => {
    // The table is written a chunk of points at a time (sweepChainInChunks): two full chunks
    // and a short one, against the whole analysis's table written from one report.
    const points = 2 * SWEEP_CHUNK + 123;
    const file = join(bundled.dir, 'bench-chain.json');
    writeFileSync(file, JSON.stringify(benchChain(points)));
    const alone = cli(file, '--sweep-only');
    expect(alone.err).toBe('');
    expect(alone.code).toBe(0);
    expect(alone.out.split('\n')).toHaveLength(points + 2); // header, rows, final newline
    expect(alone.out).toBe(sweepTableOf(cli(file, '--sweep').out));
  });

  it('should write the sweep as JSON, the values of --sweep --json', () => {
    const alone = cli(EXAMPLE('two-metre-coupled-preselector'), '--sweep-only', '--json');
    expect(alone.code).toBe(0);
    const sweep = JSON.parse(alone.out);
    const whole = JSON.parse(cli(EXAMPLE('two-metre-coupled-preselector'), '--sweep', '--json').out); // prettier-ignore
    expect(sweep).toEqual(whole.sweep);
    expect(sweep.freqsHz.length).toBeGreaterThan(100);
  });

  it('should say how long the solve, the sweep and the process took with --timing, output unchanged', () => {
    const plain = cli(FIXTURE('listener-7mhz.json'), '--sweep-only');
    const timed = cli(FIXTURE('listener-7mhz.json'), '--sweep-only', '--timing');
    expect(timed.code).toBe(0);
    expect(timed.out).toBe(plain.out);
    const seconds = (what: string) => Number(new RegExp(`^timing: ${what} ([0-9.]+) s$`, 'm').exec(timed.err)?.[1]); // prettier-ignore
    expect(seconds('solve')).toBeGreaterThan(0);
    expect(seconds('solve')).toBeLessThan(seconds('analysis'));
    expect(seconds('analysis')).toBeLessThan(seconds('whole process'));
  });

  it('should refuse, exit 1, the options it cannot honour, naming each to leave out', () => {
    const r = cli(FIXTURE('listener-7mhz.json'), '--sweep-only', '--plan', '--spice');
    expect(r.code).toBe(1);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/--sweep-only writes the sweep alone/);
    expect(r.err).toMatch(/leave out --plan, --spice/);
    const both = cli(FIXTURE('listener-7mhz.json'), '--sweep-only', '--sweep');
    expect(both.code).toBe(1);
    expect(both.err).toMatch(/leave out --sweep \(for the analysis with its sweep, use --sweep\)/);
  });

  it('should exit 3 with the problems of an invalid chain, as the analysis does', () => {
    const alone = cli(FIXTURE('invalid-values.json'), '--sweep-only');
    const whole = cli(FIXTURE('invalid-values.json'), '--sweep');
    expect(alone.code).toBe(3);
    expect(alone.out).toBe('');
    expect(alone.err).toBe(whole.err);
  });
});
