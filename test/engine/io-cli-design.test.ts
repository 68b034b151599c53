/**
 * The design options of the analysis CLI, run as a separate process on the bundle (as the
 * CLI ships): their answers, and their refusals with exit code 3 and the reason.
 */
import { join } from 'node:path';
import { bundledCli } from './helpers/bundled-cli';

const ROOT = join(__dirname, '..', '..');
const EXAMPLE = join(ROOT, 'examples', 'shortwave-superhet-single-tank.chain.json');
const cli = bundledCli('cw-cli-design-', 60_000).run;

describe('analyze CLI, design options', () => {
  it('tunes the preselector to 7.1 MHz and prints JSON the engine agrees with', () => {
    const { code, out, err } = cli(
      EXAMPLE,
      '--tune',
      'preselector/tank',
      '--solve',
      'preselector.c',
      '--to',
      '7.1e6',
      '--json',
    );
    expect(err).toBe('');
    expect(code).toBe(0);
    const r = JSON.parse(out);
    expect(Math.abs(r.resonanceHz / 7.1e6 - 1)).toBeLessThan(1e-6);
    // Thomson's formula for 2.2 µH (common practice): within 0.5 % of the loaded answer.
    expect(Math.abs(r.value * (2 * Math.PI * 7.1e6) ** 2 * 2.2e-6 - 1)).toBeLessThan(5e-3);
  });

  it('puts the pass-band peak at node 3 on 7.1 MHz with --peak-at', () => {
    const { code, out, err } = cli(EXAMPLE, '--peak-at', '3', '--solve', 'preselector.c', '--to', '7.1e6'); // prettier-ignore
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/^preselector\.c: .* → .*\npeak at node 3 7\.1\d* MHz/m);
  });

  it('prints the parts with coil turns', () => {
    const { code, out } = cli(EXAMPLE, '--parts', 'preselector');
    expect(code).toBe(0);
    expect(out).toMatch(/^Inductance,2\.200e-6,H,,10\.25,/m);
  });

  it('refuses an unknown series with exit code 3 and the choices', () => {
    const { code, err } = cli(EXAMPLE, '--snap', 'E7');
    expect(code).toBe(3);
    expect(err).toMatch(/E6, E12, E24, E48 or E96/);
  });

  it('refuses a value that cannot tune, naming it', () => {
    const { code, err } = cli(EXAMPLE, '--tune', 'preselector/tank', '--solve', 'preselector.ql');
    expect(code).toBe(3);
    expect(err).toMatch(/no inductance or capacitance "ql"/);
  });
});
