/**
 * The Touchstone reader's parse state and its error type (see `touchstone.ts`).
 */

/** One point of two-port noise parameters as the file gives them. */
export interface NoisePoint {
  fHz: number;
  nfMinDb: number;
  /** Optimum source reflection coefficient (against the file's reference). */
  gammaOpt: { re: number; im: number };
  /** Equivalent noise resistance, ohm (de-normalised). */
  rnOhm: number;
}

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
