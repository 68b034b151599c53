/**
 * The CLI's sweep output, written in chunks as it is formatted, so a 100,000-point sweep
 * never sits in memory as one string: the table (fixed-width columns, so no pass over all
 * rows first) and the JSON form (the analysis without its sweep, then the sweep's arrays).
 */
import type { AnalysisResult, SweepReport } from '../../shared/engine';
import { fastFormatNumber } from './fast-number';

/** Rows (or array elements) formatted per chunk before they are written. */
const CHUNK = 2000;

/** Writes text out; the CLI passes stdout's writer (synchronous for files and pipes on Linux). */
export type Write = (text: string) => void;

const DASH = '—';
const dec3 = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : DASH);

/** Column width of every number column: wide enough for "-1.23456e+308" and the headers. */
const WIDTH = 14;

/** The sweep as a table: frequency, step-up at every node (dB), and Zin. */
export function writeSweepTable(sweep: SweepReport, write: Write): void {
  const header = [
    'f (Hz)',
    ...sweep.nodes.map((n) => `n${n.index} (dB)`),
    'Zin re (Ω)',
    'Zin im (Ω)',
  ];
  const w = header.map((h) => Math.max(WIDTH, h.length));
  write(
    header
      .map((h, k) => (k === 0 ? h.padEnd(w[0]) : h.padStart(w[k])))
      .join('  ')
      .trimEnd() + '\n',
  );
  const P = sweep.freqsHz.length;
  const nodes = sweep.nodes;
  const zk = nodes.length + 1;
  for (let i0 = 0; i0 < P; i0 += CHUNK) {
    let text = '';
    for (let i = i0; i < Math.min(P, i0 + CHUNK); i++) {
      // One string per row, padded in place: no per-cell arrays on a 100,000-row table.
      let row = fastFormatNumber(sweep.freqsHz[i], 9).padEnd(w[0]);
      for (let k = 0; k < nodes.length; k++)
        row += '  ' + dec3(nodes[k].stepUpDb[i]).padStart(w[k + 1]);
      row += '  ' + fastFormatNumber(sweep.zIn.re[i], 6).padStart(w[zk]);
      row += '  ' + fastFormatNumber(sweep.zIn.im[i], 6).padStart(w[zk + 1]);
      text += row + '\n';
    }
    write(text);
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
