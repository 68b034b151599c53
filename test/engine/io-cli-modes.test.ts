/**
 * The analysis CLI on a chain with modes: listing them, analysing one by `--mode`, and a
 * clear refusal (exit 3) for a mode the chain does not have. Runs the esbuild bundle as a
 * separate process, like io-cli.test.ts.
 */
import { join } from 'node:path';
import { bundledCli } from './helpers/bundled-cli';
import type { AnalysisResult } from '../../shared/engine/types';

const EXAMPLE = join(__dirname, '..', '..', 'examples', 'ism-433-transceiver-shared-antenna.chain.json'); // prettier-ignore
const cli = bundledCli('cw-cli-modes-').run;

describe('analyze CLI with modes', () => {
  it('lists the modes, the first marked as the one analysed by default', () => {
    const { code, out } = cli(EXAMPLE, '--list-modes');
    expect(code).toBe(0);
    expect(out.split('\n').filter(Boolean)).toEqual([
      expect.stringMatching(/^receive\s+receive\s+Receive\s+\(analysed when no --mode is given\)$/),
      expect.stringMatching(/^transmit\s+transmit\s+Transmit$/),
    ]);
  });

  it('analyses the named mode, with its transmit figures and the caution', () => {
    const { code, out, err } = cli(EXAMPLE, '--mode', 'transmit');
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/^Chain ".* — Transmit"/);
    expect(out).toMatch(/^Mode: Transmit \(transmit, transmit\)$/m);
    expect(out).toMatch(/^Caution: This chain can radiate/m);
    expect(out).toMatch(/^Transmit: 19\.\d dBm/m);
    expect(out).toMatch(/^ {2}harmonic 2·f0: attenuated \d+\.\d dB \(limit 20 dB: MISSED\)$/m);
    const json = JSON.parse(cli(EXAMPLE, '--mode', 'transmit', '--json').out) as AnalysisResult;
    expect(json.mode?.id).toBe('transmit');
    expect(json.transmit?.deliveredW).toBeGreaterThan(0.09);
    const rx = JSON.parse(cli(EXAMPLE, '--json').out) as AnalysisResult;
    expect(rx.mode?.id).toBe('receive');
    expect(rx.transmit).toBeUndefined();
  });

  it('refuses a mode the chain does not have, naming the ones it has', () => {
    const { code, err } = cli(EXAMPLE, '--mode', 'standby');
    expect(code).toBe(3);
    expect(err).toMatch(/no mode "standby"; its modes are "receive", "transmit"/);
    expect(cli(EXAMPLE, '--mode').code).toBe(1);
  });
});
