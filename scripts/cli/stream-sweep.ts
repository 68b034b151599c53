/**
 * The CLI's sweep output, written as it is formatted, so a 100,000-point sweep never sits in
 * memory as one string: the table (fixed-width columns, so no pass over all rows first;
 * bytes straight into the output buffer) and the JSON form (the analysis without its
 * sweep, then the sweep's arrays, in chunks).
 */
import type { AnalysisResult, SweepReport } from '../../shared/engine';
import { sweepColumns } from '../../shared/engine/core/sweep-readers';
import type { ByteSink } from './byte-sink';
import { CELL_SLACK, putFixed3, putSignificant } from './number-bytes';

/** Array elements formatted per chunk before they are written. */
const CHUNK = 2000;
/** Table rows whose step-ups are computed together. */
const ROWS = 512;

/** Writes text out; the CLI passes its output's writer. */
export type Write = (text: string) => void;

const DASH = '—';
const SPACE = 32;
const NEWLINE = 10;

/** Column width of every number column: wide enough for "-1.23456e+308" and the headers. */
const WIDTH = 14;

/** The table's header cells: frequency, each node's step-up, the two parts of Zin. */
function tableHeader(sweep: SweepReport): string[] {
  return ['f (Hz)', ...sweep.nodes.map((n) => `n${n.index} (dB)`), 'Zin re (Ω)', 'Zin im (Ω)'];
}

/** Each column's width: the widest of its header and {@link WIDTH}. */
const tableWidths = (header: string[]) => header.map((h) => Math.max(WIDTH, h.length));

/**
 * The sweep as a table: frequency, step-up at every node (dB, three decimals), and Zin (six
 * significant figures), written into the sink's buffer a row at a time.
 */
export function writeSweepTable(sweep: SweepReport, out: ByteSink): void {
  writeSweepTableHeader(sweep, out);
  writeSweepTableRows(sweep, out);
}

/** The table's header line (of any chunk of the sweep: each has every node). */
export function writeSweepTableHeader(sweep: SweepReport, out: ByteSink): void {
  const header = tableHeader(sweep);
  const w = tableWidths(header);
  out.text(
    header
      .map((h, k) => (k === 0 ? h.padEnd(w[0]) : h.padStart(w[k])))
      .join('  ')
      .trimEnd() + '\n',
  );
}

/**
 * The table's rows for every point of `sweep`: the whole sweep, or one chunk of it after the
 * rows of the chunks before (the columns are fixed-width, so a chunk needs nothing of the
 * others).
 */
export function writeSweepTableRows(sweep: SweepReport, out: ByteSink): void {
  const w = tableWidths(tableHeader(sweep));
  const { freqs: f, zinRe: re, zinIm: im, stepUpDb } = sweepColumns(sweep);
  const P = f.length;
  const columns = sweep.nodes.length;
  const wz = w[columns + 1];
  const wi = w[columns + 2];
  // The most a row can take: every column, its gap, and the slack of a long fallback cell.
  const rowBytes = w.reduce((a, b) => a + b + 2, 1) + CELL_SLACK * w.length;
  // Each node's step-up a block of rows at a time: no whole trace is ever made.
  const stepUp = Array.from({ length: columns }, () => new Float64Array(Math.min(P, ROWS)));
  // The cell writers write into spaces (number-bytes.ts): the buffer from the first row on
  // is filled with spaces, and again after each time it is written out. A row goes after the
  // last, so past its end the buffer is still spaces.
  let spaced: Uint8Array | null = null;
  let next = 0;
  for (let i0 = 0; i0 < P; i0 += ROWS) {
    const n = Math.min(ROWS, P - i0);
    for (let k = 0; k < columns; k++) stepUpDb(k, i0, n, stepUp[k]);
    for (let r = 0; r < n; r++) {
      const i = i0 + r;
      out.room(rowBytes);
      const buf = out.buf;
      if (buf !== spaced || out.pos !== next) {
        buf.fill(SPACE, out.pos);
        spaced = buf;
      }
      let pos = putSignificant(buf, out.pos, f, i, 9, w[0], true);
      for (let k = 0; k < columns; k++) pos = putFixed3(buf, pos + 2, stepUp[k], r, w[k + 1], DASH);
      pos = putSignificant(buf, pos + 2, re, i, 6, wz);
      pos = putSignificant(buf, pos + 2, im, i, 6, wi);
      buf[pos++] = NEWLINE;
      out.pos = next = pos;
    }
  }
}

/** A number as JSON writes it (non-finite values become null). */
const json = (v: number) => (Number.isFinite(v) ? String(v) : 'null');

function writeArray(values: ArrayLike<number>, write: Write): void {
  write('[');
  for (let i0 = 0; i0 < values.length; i0 += CHUNK) {
    const parts: string[] = [];
    for (let i = i0; i < Math.min(values.length, i0 + CHUNK); i++) parts.push(json(values[i]));
    write((i0 > 0 ? ',' : '') + parts.join(','));
  }
  write(']');
}

/**
 * The sweep's members, from "freqsHz" to "returnLossDb", each array on one line, the
 * members indented by `pad` (the closing brace is the caller's).
 */
function writeSweepMembers(sweep: SweepReport, write: Write, pad: string): void {
  write(`${pad}"freqsHz": `);
  writeArray(sweep.freqsHz, write);
  write(`,\n${pad}"nodes": [`);
  sweep.nodes.forEach((n, k) => {
    write(`${k > 0 ? ',' : ''}\n${pad}  { "index": ${n.index}, "stepUpDb": `);
    writeArray(n.stepUpDb, write);
    write(', "phaseDeg": ');
    writeArray(n.phaseDeg, write);
    write(' }');
  });
  write(`\n${pad}],\n${pad}"zIn": { "re": `);
  writeArray(sweep.zIn.re, write);
  write(', "im": ');
  writeArray(sweep.zIn.im, write);
  write(` },\n${pad}"returnLossDb": `);
  writeArray(sweep.returnLossDb, write);
}

/**
 * The whole result as JSON, the sweep streamed last: the same document `JSON.stringify`
 * would give (the head indented, the sweep's arrays on single lines).
 */
export function writeResultJson(result: AnalysisResult, write: Write): void {
  const { sweep, ...head } = result;
  const text = JSON.stringify(head, null, 2);
  if (!sweep) {
    write(text + '\n');
    return;
  }
  write(text.slice(0, text.lastIndexOf('}')).trimEnd() + ',\n  "sweep": {\n');
  writeSweepMembers(sweep, write, '    ');
  write('\n  }\n}\n');
}

/** The sweep alone as a JSON document, streamed as in {@link writeResultJson}. */
export function writeSweepJson(sweep: SweepReport, write: Write): void {
  write('{\n');
  writeSweepMembers(sweep, write, '  ');
  write('\n}\n');
}
