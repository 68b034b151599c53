/**
 * Parser of ngspice `wrdata` tables of an AC analysis.
 *
 * The netlists written by `chainToSpice` set `wr_singlescale` and `wr_vecnames`, so the
 * table has one header row (`frequency`, then every vector's name twice: real and
 * imaginary part) and one row per frequency:
 *
 *     frequency  v(n0)  v(n0)  v(n1)  v(n1)
 *     1.0e+05    1.0    0.0    0.71   -0.45
 */

/** Complex vectors of one AC analysis; index i ↔ freqsHz[i]. */
export interface AcTable {
  freqsHz: Float64Array;
  /** Vector name as ngspice wrote it, lower case (e.g. "v(n1)", "i(sv)"). */
  vectors: Map<string, { re: Float64Array; im: Float64Array }>;
}

/** An ngspice output that is not the table this parser expects. */
export class SpiceOutputError extends Error {
  constructor(message: string) {
    super(`ngspice output: ${message}`);
    this.name = 'SpiceOutputError';
  }
}

/**
 * Parses a `wrdata` table written with `set wr_singlescale` and `set wr_vecnames`.
 * @throws SpiceOutputError when the header or a row is not as expected
 */
export function parseWrdata(text: string): AcTable {
  const rows = text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l !== '');
  if (rows.length === 0) throw new SpiceOutputError('the data file is empty (did the .ac run?)');
  const header = rows[0].split(/\s+/).map((h) => h.toLowerCase());
  if (header[0] !== 'frequency' || header.length % 2 !== 1) {
    throw new SpiceOutputError(
      `expected a header "frequency name name …" (set wr_singlescale and wr_vecnames), got "${rows[0].slice(0, 80)}"`,
    );
  }
  const names: string[] = [];
  for (let c = 1; c < header.length; c += 2) {
    if (header[c] !== header[c + 1]) {
      throw new SpiceOutputError(
        `vector "${header[c]}" has no imaginary column; run an AC analysis`,
      );
    }
    names.push(header[c]);
  }
  const n = rows.length - 1;
  const freqsHz = new Float64Array(n);
  const vectors = new Map(
    names.map((name) => [name, { re: new Float64Array(n), im: new Float64Array(n) }]),
  );
  const columns = [...vectors.values()];
  for (let r = 0; r < n; r++) {
    const cells = rows[r + 1].split(/\s+/).map(Number);
    if (cells.length !== header.length || cells.some((v) => !Number.isFinite(v))) {
      throw new SpiceOutputError(
        `row ${r + 2} has ${cells.length} cells or a non-number; expected ${header.length}`,
      );
    }
    freqsHz[r] = cells[0];
    for (let k = 0; k < columns.length; k++) {
      columns[k].re[r] = cells[1 + 2 * k];
      columns[k].im[r] = cells[2 + 2 * k];
    }
  }
  return { freqsHz, vectors };
}

/** Figures ngspice's `rusage` prints, in seconds, when present in its output. */
export interface SpiceTimes {
  analysisS?: number;
  acS?: number;
  elapsedS?: number;
}

/** Reads "Total analysis time", "AC analysis time" and "Total elapsed time" from stdout. */
export function parseRusage(stdout: string): SpiceTimes {
  const pick = (re: RegExp) => {
    const m = re.exec(stdout);
    return m ? Number(m[1]) : undefined;
  };
  return {
    analysisS: pick(/Total analysis time \(seconds\)\s*=\s*([0-9.eE+-]+)/),
    acS: pick(/AC analysis time\s*=\s*([0-9.eE+-]+)/i),
    elapsedS: pick(/Total elapsed time \(seconds\)\s*=\s*([0-9.eE+-]+)/),
  };
}
