/**
 * The Touchstone reader's parse state and its error type (see `touchstone.ts`).
 */

import type { NoisePoint } from './network-data';

export type { NoisePoint } from './network-data';

/** A Touchstone file that cannot be read as written. */
export class TouchstoneError extends Error {
  constructor(
    readonly fileName: string,
    readonly line: number | undefined,
    detail: string,
  ) {
    super(`${fileName}${line === undefined ? '' : `, line ${line}`}: ${detail}`);
    this.name = 'TouchstoneError';
  }
}

export type Format = 'DB' | 'MA' | 'RI';
export type Section = 'header' | 'network' | 'noise' | 'information' | 'end';

/** Everything the reader knows part-way through a file. */
export interface ParseState {
  readonly fileName: string;
  lineNo: number;
  version: string;
  ports: 1 | 2 | undefined;
  optionLineSeen: boolean;
  freqScale: number;
  parameter: 'S' | 'Y' | 'Z';
  format: Format;
  reference: number;
  /**
   * Per-port references from `[Reference]` (or a 1.1-style "R 50 75" option line); empty
   * when every port uses `reference`. Data given against them is renormalised to port 1's.
   */
  portReferences: number[];
  /** Line of a `[Reference]` whose values continue on the following lines, else 0. */
  referenceLine: number;
  expectedNoiseFrequencies: number | undefined;
  /** Lines of `[Number of Frequencies]` and `[Number of Noise Frequencies]`, for messages. */
  expectedFrequenciesLine: number;
  expectedNoiseFrequenciesLine: number;
  /** Whether two-port columns come N11 N21 N12 N22 (1.x and `21_12`). */
  order21First: boolean;
  /** Whether `[Two-Port Data Order]` was given (2.x two-ports must give it). */
  orderGiven: boolean;
  section: Section;
  expectedFrequencies: number | undefined;
  /** Numbers of a v2 point that continues on the next line, and where it started. */
  pending: number[];
  pendingLine: number;
  freqs: number[];
  values: number[];
  noise: NoisePoint[];
  comments: string[];
}

/** Port count from a `.s<n>p` file name, when it has one. */
export function portsFromName(fileName: string): 1 | 2 | undefined {
  const m = /\.s([0-9]+)p$/i.exec(fileName);
  if (!m) return undefined;
  const n = Number(m[1]);
  if (n === 1 || n === 2) return n;
  throw new TouchstoneError(
    fileName,
    undefined,
    `a ${n}-port file; only 1- and 2-port files are read`,
  );
}

export function fail(state: ParseState, detail: string, line: number = state.lineNo): never {
  throw new TouchstoneError(state.fileName, line, detail);
}
