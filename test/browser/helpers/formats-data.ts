/**
 * The files the exchange-formats browser test uploads: a Touchstone 2.0 amplifier with noise
 * data, a team's parts list in a CSV whose headers the upload must map, and a chain file.
 */

/**
 * An amplifier measured at 100 and 200 MHz: 20 dB gain, matched, with the same noise
 * parameters at both points: NFmin 1 dB, Γopt 0.5∠0°, Rn 25 Ω (2.0: ohms).
 */
export const AMPLIFIER_TS = [
  '! Test amplifier for the browser check',
  '[Version] 2.0',
  '# MHz S RI R 50',
  '[Number of Ports] 2',
  '[Two-Port Data Order] 12_21',
  '[Number of Frequencies] 2',
  '[Number of Noise Frequencies] 2',
  '[Reference] 50 50',
  '[Network Data]',
  '100 0 0 0.01 0 10 0 0 0',
  '200 0 0 0.01 0 10 0 0 0',
  '[Noise Data]',
  '100 1.0 0.5 0 25',
  '200 1.0 0.5 0 25',
  '[End]',
  '',
].join('\n');

/** The minimum noise figure of the file, which a 50 Ω source does not reach. */
export const NF_MIN_DB = 1.0;

/**
 * The expected noise figure from a 50 Ω source (Γs = 0), by the two-port noise formula in
 * reflection form (Pozar, "Microwave Engineering", noise figure of a two-port):
 * F = Fmin + 4·rn·|Γs − Γopt|² / ((1 − |Γs|²)·|1 + Γopt|²), rn = 25/50.
 */
export const EXPECTED_NF_DB = 10 * Math.log10(10 ** (NF_MIN_DB / 10) + (4 * 0.5 * 0.25) / 1.5 ** 2); // 1.706 dB

/** Headers the upload cannot guess ("L/C", "Ref", "@"): the preview asks for them. */
export const PARTS_CSV = [
  'Ref;L/C;Nominal;Qu;@;Tol;Remarks',
  'BIN-7;L;2.2 uH;85;7 MHz;5;air core',
  'BIN-9;C;150p;800;7 MHz;2;NP0 disc',
  '',
].join('\n');

/** A chain file: a 50 Ω generator, the measured amplifier, a tank and a load, at 150 MHz. */
export function chainFile(name: string): string {
  return JSON.stringify(
    {
      format: 'chainwright-chain',
      formatVersion: 1,
      name,
      description: 'A measured amplifier ahead of a tank, for the formats check.',
      settings: {
        f0Hz: 150e6,
        sweep: { startHz: 100e6, stopHz: 200e6, points: 41, scale: 'lin' },
      },
      stages: [
        { id: 'src', type: 'resistive-generator', label: 'Signal generator', values: { r: 50 } },
        {
          id: 'amp',
          type: 'measured-two-port',
          label: 'Measured amplifier',
          values: { noise: 'passive' },
        },
        { id: 'tank', type: 'shunt-lc-tank', label: 'Output tank', values: {} },
        { id: 'load', type: 'rc-load', label: 'Load', values: {} },
      ],
    },
    null,
    2,
  );
}
