/**
 * The CLI's sweep output, written in chunks as it is formatted, so a 100,000-point sweep
 * never sits in memory as one string: the table (fixed-width columns, so no pass over all
 * rows first) and the JSON form (the analysis without its sweep, then the sweep's arrays).
 */
import type { AnalysisResult, SweepReport } from '../../shared/engine';
import { formatNumber } from '../../shared/engine';

/** Rows (or array elements) formatted per chunk before they are written. */
const CHUNK = 2000;

/** Writes text out; the CLI passes stdout's writer (synchronous for files and pipes on Linux). */
export type Write = (text: string) => void;

const DASH = '—';
const dec3 = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : DASH);

/** Column width of every number column: wide enough for "-1.23456e+308" and the headers. */
const WIDTH = 14;
const right = (cell: string, width: number) => ' '.repeat(Math.max(0, width - cell.length)) + cell;

/** The sweep as a table: frequency, step-up at every node (dB), and Zin. */
export function writeSweepTable(sweep: SweepReport, write: Write): void {
  const header = [
    'f (Hz)',
    ...sweep.nodes.map((n) => `n${n.index} (dB)`),
    'Zin re (Ω)',
    'Zin im (Ω)',
  ];
  const widths = header.map((h) => Math.max(WIDTH, h.length));
  const line = (cells: string[]) =>
    cells
      .map((c, k) =>
        k === 0 ? c + ' '.repeat(Math.max(0, widths[0] - c.length)) : right(c, widths[k]),
      )
      .join('  ')
      .trimEnd();
  write(line(header) + '\n');
  const P = sweep.freqsHz.length;
  for (let i0 = 0; i0 < P; i0 += CHUNK) {
    const rows: string[] = [];
    for (let i = i0; i < Math.min(P, i0 + CHUNK); i++) {
      rows.push(
        line([
          formatNumber(sweep.freqsHz[i], 9),
          ...sweep.nodes.map((n) => dec3(n.stepUpDb[i])),
          formatNumber(sweep.zIn.re[i], 6),
          formatNumber(sweep.zIn.im[i], 6),
        ]),
      );
    }
    write(rows.join('\n') + '\n');
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
  write(text.slice(0, text.lastIndexOf('}')).trimEnd() + ',\n  "sweep": {\n    "freqsHz": ');
  writeArray(sweep.freqsHz, write);
  write(',\n    "nodes": [');
  sweep.nodes.forEach((n, k) => {
    write(`${k > 0 ? ',' : ''}\n      { "index": ${n.index}, "stepUpDb": `);
    writeArray(n.stepUpDb, write);
    write(', "phaseDeg": ');
    writeArray(n.phaseDeg, write);
    write(' }');
  });
  write('\n    ],\n    "zIn": { "re": ');
  writeArray(sweep.zIn.re, write);
  write(', "im": ');
  writeArray(sweep.zIn.im, write);
  write(' },\n    "returnLossDb": ');
  writeArray(sweep.returnLossDb, write);
  write('\n  }\n}\n');
}
