/**
 * Touchstone reader for one- and two-port files (`.s1p`, `.s2p`, `.ts`).
 *
 * Follows the Touchstone® File Format Specification Rev 1.1 (EIA/IBIS Open Forum) and
 * Version 2.0 (IBIS Open Forum, ratified 24 April 2009) for one and two ports: `[Version]`,
 * `[Number of Ports]`, `[Two-Port Data Order]`, `[Number of Frequencies]`, `[Number of
 * Noise Frequencies]`, `[Reference]` per port (on its line or the lines after it),
 * `[Matrix Format] Full`, `[Network Data]`, `[Noise Data]`, `[Begin/End Information]`
 * (skipped) and `[End]`. Mixed-mode data and Lower/Upper matrices are refused by name.
 *
 * `[Two-Port Data Order]`: `21_12` means the columns run N11 N21 N12 N22 (the order of
 * every 1.x two-port file) and `12_21` means N11 N12 N21 N22. Version 2.0, section
 * "[Two-Port Data Order]" (p. 8 of the 2009 edition) defines the two arguments this way,
 * and its own two-port H-parameter example labels the columns "freq magH11 angH11 magH21
 * angH21 magH12 angH12 magH22 angH22" under `[Two-Port Data Order] 21_12`. (Some secondary
 * write-ups swap the two; the specification's example settles it.)
 *
 * What the specifications say and this reader does:
 * - the option line `# <unit> <parameter> <format> R <n>` may give its fields in any order and
 *   omit any of them; the defaults are GHz, S, MA, R 50; only the first option line counts;
 * - everything is case-insensitive; `!` starts a comment that runs to the end of the line;
 * - DB is 20·log10|x| with the angle in degrees, MA is magnitude and degrees, RI is re, im;
 * - Y and Z data in 1.x files are normalised to R (in 2.x files they are in siemens / ohm);
 * - a 1.x two-port point is one line; a 2.x point may continue over several lines;
 * - in a 1.x two-port file the noise parameters start where the frequency stops increasing
 *   (f, NFmin dB, |Γopt|, ∠Γopt, Rn normalised to R); in 2.x they follow `[Noise Data]`
 *   with Rn in ohms;
 * - ports with different references (`[Reference] 50 75`) are renormalised to port 1's.
 *
 * Output is the canonical `NetworkData` (Hz, S re/im, one real reference). Every error is a
 * `TouchstoneError` naming the file and line and saying what to change.
 */
import { normalisedToS, renormaliseTwoPort, sStride, type NetworkData } from './network-data';
import { addReferenceValues, readKeyword, readOptionLine } from './touchstone-header';
import {
  fail,
  portsFromName,
  TouchstoneError,
  type Format,
  type NoisePoint,
  type ParseState,
} from './touchstone-state';

export { TouchstoneError, type NoisePoint } from './touchstone-state';

/** A parsed Touchstone file in canonical form. */
export interface TouchstoneFile extends NetworkData {
  fileName: string;
  /** '1.1' for files without `[Version]`, otherwise the version the file states. */
  version: string;
  /** The parameter the file held before conversion to S. */
  sourceParameter: 'S' | 'Y' | 'Z';
  /** Two-port noise parameters, when the file has them. */
  noise: NoisePoint[];
  /** Comment text (without `!`), in file order. */
  comments: string[];
}

export interface ReadTouchstoneOptions {
  /** Port count when the file name does not say (`.s1p`/`.s2p`) and the file has no keyword. */
  ports?: 1 | 2;
}

/**
 * Reads the text of a one- or two-port Touchstone file.
 * @param text the file's content
 * @param fileName used for the port count (`.s1p`/`.s2p`) and in every error message
 * @throws TouchstoneError naming the file, the line and what to change
 */
export function readTouchstone(
  text: string,
  fileName: string,
  options: ReadTouchstoneOptions = {},
): TouchstoneFile {
  const state: ParseState = {
    fileName,
    lineNo: 0,
    version: '1.1',
    ports: portsFromName(fileName) ?? options.ports,
    optionLineSeen: false,
    freqScale: 1e9,
    parameter: 'S',
    format: 'MA',
    reference: 50,
    portReferences: [],
    referenceLine: 0,
    expectedNoiseFrequencies: undefined,
    expectedFrequenciesLine: 0,
    expectedNoiseFrequenciesLine: 0,
    order21First: true,
    orderGiven: false,
    section: 'header',
    expectedFrequencies: undefined,
    pending: [],
    pendingLine: 0,
    freqs: [],
    values: [],
    noise: [],
    comments: [],
  };
  for (const raw of text.split(/\r\n|\r|\n/)) {
    state.lineNo++;
    readLine(state, raw);
    if (state.section === 'end') break;
  }
  return finish(state);
}

function readLine(state: ParseState, raw: string): void {
  const bang = raw.indexOf('!');
  if (bang >= 0) state.comments.push(raw.slice(bang + 1).trim());
  const line = (bang >= 0 ? raw.slice(0, bang) : raw).trim();
  if (line === '') return;
  if (state.section === 'information') {
    if (/^\[end information\]/i.test(line)) state.section = 'header';
    return;
  }
  if (state.referenceLine > 0) {
    if (line.startsWith('[') || line.startsWith('#')) {
      fail(
        state,
        `[Reference] gives fewer values than the file has ports; give one per port`,
        state.referenceLine,
      );
    }
    return addReferenceValues(state, line);
  }
  if (line.startsWith('[')) return readKeyword(state, line);
  if (line.startsWith('#')) return readOptionLine(state, line);
  readDataLine(state, line);
}

function readDataLine(state: ParseState, line: string): void {
  if (!state.optionLineSeen) {
    fail(state, 'data before the option line; start the file with e.g. "# GHz S MA R 50"');
  }
  if (state.version !== '1.1' && state.section === 'header') {
    fail(state, 'a 2.x file needs [Network Data] before its data');
  }
  const tokens = line.split(/\s+/);
  const numbers = tokens.map(Number);
  const bad = numbers.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) fail(state, `"${tokens[bad]}" is not a number`);
  if (state.section === 'noise') return readNoise(state, numbers);
  if (state.pending.length > 0) {
    return addToPending(state, numbers);
  }
  const ports = state.ports ?? inferPorts(state, numbers.length);
  const needed = 1 + 2 * ports * ports;
  // 1.x two-port noise data: frequency at or below the last one, five numbers.
  const last = state.freqs[state.freqs.length - 1];
  if (ports === 2 && state.version === '1.1' && last !== undefined) {
    if (numbers[0] * state.freqScale <= last && numbers.length === 5) {
      state.section = 'noise';
      return readNoise(state, numbers);
    }
  }
  if (numbers.length === needed) return addPoint(state, numbers);
  if (numbers.length < needed && state.version !== '1.1') {
    state.pending = numbers;
    state.pendingLine = state.lineNo;
    return;
  }
  fail(state, `${numbers.length} numbers on a data line; ${describePoint(ports)}`);
}

function describePoint(ports: 1 | 2): string {
  return ports === 1
    ? 'a one-port point needs 3 (frequency and S11 as two numbers)'
    : 'a two-port point needs 9 (frequency and N11 N21 N12 N22 as two numbers each)';
}

function inferPorts(state: ParseState, count: number): 1 | 2 {
  if (count === 3) return (state.ports = 1);
  if (count === 9) return (state.ports = 2);
  return fail(
    state,
    `${count} numbers on the first data line, so the port count is unclear; name the file .s1p or .s2p`,
  );
}

function addToPending(state: ParseState, numbers: number[]): void {
  const ports = state.ports ?? 2;
  const needed = 1 + 2 * ports * ports;
  const all = state.pending.concat(numbers);
  if (all.length > needed) {
    fail(
      state,
      `a point ran past its ${needed} numbers; ${describePoint(ports)}`,
      state.pendingLine,
    );
  }
  if (all.length < needed) {
    state.pending = all;
    return;
  }
  state.pending = [];
  addPoint(state, all, state.pendingLine);
}

function addPoint(state: ParseState, numbers: number[], line: number = state.lineNo): void {
  const ports = state.ports ?? 1;
  if (state.portReferences.length > 0 && state.portReferences.length !== ports) {
    fail(
      state,
      `${state.portReferences.length} reference resistances for ${ports} port(s); give one per port`,
      line,
    );
  }
  const f = numbers[0] * state.freqScale;
  const last = state.freqs[state.freqs.length - 1];
  if (!(f >= 0)) fail(state, 'a frequency must not be negative', line);
  if (!Number.isFinite(f)) fail(state, `the frequency ${numbers[0]} is too large`, line);
  if (last !== undefined && !(f > last)) {
    fail(
      state,
      `frequencies must increase, but ${numbers[0]} comes after ${last / state.freqScale}; ` +
        'sort the points by frequency and remove repeats',
      line,
    );
  }
  const pairs: number[] = [];
  for (let k = 1; k < numbers.length; k += 2) {
    pairs.push(...toRectangular(state.format, numbers[k], numbers[k + 1]));
  }
  if (!pairs.every(Number.isFinite)) {
    fail(state, 'a value is too large to represent; check the format (DB, MA or RI)', line);
  }
  // Columns in file order → row-major S11 S12 S21 S22.
  const m =
    ports === 2 && state.order21First ? [0, 1, 4, 5, 2, 3, 6, 7].map((i) => pairs[i]) : pairs;
  state.freqs.push(f);
  if (state.parameter === 'S') {
    if (ports === 2 && state.portReferences.length > 0) {
      const [r1, r2] = state.portReferences;
      const out = new Float64Array(8);
      if (!renormaliseTwoPort(m, r1, r2, state.reference, out, 0)) {
        fail(state, `the point cannot be renormalised from ${r1}/${r2} ohm to one reference`, line);
      }
      state.values.push(...out);
      return;
    }
    state.values.push(...m);
    return;
  }
  // 2.x Y/Z are in siemens/ohm; 1.x are already normalised to R.
  const scale =
    state.version === '1.1' ? 1 : state.parameter === 'Z' ? 1 / state.reference : state.reference;
  const s = new Float64Array(m.length);
  normalisedToS(
    state.parameter,
    ports,
    m.map((v) => v * scale),
    s,
    0,
  );
  if (!s.every(Number.isFinite)) {
    fail(state, `the ${state.parameter}-parameters of this point have no S-parameters`, line);
  }
  state.values.push(...s);
}

function toRectangular(format: Format, a: number, b: number): [number, number] {
  if (format === 'RI') return [a, b];
  const mag = format === 'MA' ? a : Math.pow(10, a / 20);
  const rad = (b * Math.PI) / 180;
  return [mag * Math.cos(rad), mag * Math.sin(rad)];
}

function readNoise(state: ParseState, numbers: number[]): void {
  if (numbers.length !== 5) {
    fail(
      state,
      `${numbers.length} numbers on a noise line; it needs 5 (f, NFmin dB, |Γopt|, ∠Γopt, Rn)`,
    );
  }
  const f = numbers[0] * state.freqScale;
  const last = state.noise[state.noise.length - 1];
  if (last && !(f > last.fHz)) fail(state, 'noise frequencies must increase');
  if (!(f >= 0) || !Number.isFinite(f)) {
    fail(state, 'a noise frequency must be a finite number not below 0');
  }
  if (!(numbers[2] >= 0)) fail(state, 'the magnitude of Γopt must not be negative');
  if (!(numbers[4] >= 0)) fail(state, 'the noise resistance Rn must not be negative');
  const rad = (numbers[3] * Math.PI) / 180;
  state.noise.push({
    fHz: f,
    nfMinDb: numbers[1],
    gammaOpt: { re: numbers[2] * Math.cos(rad), im: numbers[2] * Math.sin(rad) },
    // Rn: normalised to the reference in 1.x files, in ohms in 2.x files. The 2.0
    // specification gives the same device both ways in its noise examples (Rn 0.38 and 0.40
    // in the 1.0 file, 19 and 20 in the 2.0 file, reference 50 ohm).
    rnOhm: state.version === '1.1' ? numbers[4] * state.reference : numbers[4],
  });
}

function finish(state: ParseState): TouchstoneFile {
  if (state.pending.length > 0) {
    fail(state, 'the last frequency point is incomplete', state.pendingLine);
  }
  if (state.freqs.length === 0) {
    // The whole file was read without a point: point at its last line.
    fail(state, 'no data points found; a data line starts with its frequency');
  }
  if (state.expectedFrequencies !== undefined && state.expectedFrequencies !== state.freqs.length) {
    fail(
      state,
      `[Number of Frequencies] says ${state.expectedFrequencies} but the file has ` +
        `${state.freqs.length} points; correct the count`,
      state.expectedFrequenciesLine,
    );
  }
  if (state.referenceLine > 0) {
    fail(state, '[Reference] gives fewer values than the file has ports', state.referenceLine);
  }
  if (
    state.expectedNoiseFrequencies !== undefined &&
    state.expectedNoiseFrequencies !== state.noise.length
  ) {
    fail(
      state,
      `[Number of Noise Frequencies] says ${state.expectedNoiseFrequencies} but the file has ` +
        `${state.noise.length} noise points; correct the count`,
      state.expectedNoiseFrequenciesLine,
    );
  }
  const ports = state.ports ?? 1;
  if (state.values.length !== sStride(ports) * state.freqs.length) {
    throw new TouchstoneError(state.fileName, undefined, 'internal: point size mismatch');
  }
  return {
    fileName: state.fileName,
    version: state.version,
    ports,
    sourceParameter: state.parameter,
    freqsHz: Float64Array.from(state.freqs),
    s: Float64Array.from(state.values),
    z0: state.reference,
    noise: state.noise,
    comments: state.comments,
  };
}
