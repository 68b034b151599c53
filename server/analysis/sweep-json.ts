/**
 * The sweep columns written straight to JSON bytes, byte for byte what
 * `JSON.stringify(sweepToColumns(sweep, traces, nodes))` gives, at a fraction of its cost:
 * each value is rounded to an integer mantissa and its digits written by hand, rather than
 * rounded to a double that JSON.stringify then prints with its shortest-round-trip search
 * (together most of an analysis thread's time on a 2,001-point answer).
 *
 * Why the bytes match: `roundSignificant` returns m / 10^s (or m · 10^-s) for an integer
 * mantissa m of at most 15 digits. A decimal of at most 15 significant digits is the only
 * one that names its double (DBL_DIG is 15), so the shortest form JSON prints is m's
 * digits with the decimal point placed s digits from the right and trailing zeros dropped;
 * below 10^15, m · 10^-s is an exact integer. JSON switches to exponent form below 1e-6;
 * such values, those from 10^15 up, and shifts beyond the table go through
 * `roundSignificant` and JSON.stringify.
 */
import { nodeTraceValues, traceValues } from '../../shared/engine/core/sweep-readers';
import type { SweepReport } from '../../shared/engine/types';
import {
  FREQUENCY_DIGITS,
  SWEEP_DIGITS,
  roundSignificant,
  type SweepTrace,
} from '../../shared/schema/sweep-columns';
import {
  columnMantissas,
  countOf,
  POW10,
  type SweepPacking,
} from '../../shared/schema/sweep-packing';

const USUAL_BYTES = 1 << 18;
/** Grows as needed; reused between answers (one analysis at a time per thread). */
let out = Buffer.allocUnsafe(USUAL_BYTES);
let at = 0;
const digitsScratch = new Uint8Array(24);

const COMMA = 44;
const DOT = 46;
const MINUS = 45;
const ZERO = 48;

function room(bytes: number): void {
  if (at + bytes <= out.length) return;
  const bigger = Buffer.allocUnsafe(Math.max(out.length * 2, at + bytes));
  out.copy(bigger, 0, 0, at);
  out = bigger;
}

function ascii(text: string): void {
  room(text.length);
  at += out.write(text, at, 'latin1');
}

/** Writes `v` as JSON prints roundSignificant(v, digits). */
function writeRounded(v: number, digits: number): void {
  if (v === 0 || !Number.isFinite(v)) return ascii(v === 0 ? '0' : 'null');
  const a = Math.abs(v);
  const shift = digits - 1 - Math.floor(Math.log10(a));
  // JSON's exponent forms, and shifts the fast path has no exact power of ten for.
  if (a < 2e-6 || a >= 1e15 || shift >= POW10.length) {
    return ascii(JSON.stringify(roundSignificant(v, digits)));
  }
  // The same arithmetic as roundSignificant, so the same mantissa (Math.round's halves
  // round towards +∞, which is why the sign goes in before rounding).
  const m = shift >= 0 ? Math.round(v * POW10[shift]) : Math.round(v / POW10[-shift]);
  if (m === 0) return ascii('0');
  room(48);
  if (m < 0) out[at++] = MINUS;
  // The mantissa's digits, least significant first (in 32-bit integers when they fit).
  let len = 0;
  if (m < 2 ** 31 && m > -(2 ** 31)) {
    for (let n = (m < 0 ? -m : m) | 0; n > 0;) {
      const q = (n / 10) | 0;
      digitsScratch[len++] = n - q * 10;
      n = q;
    }
  } else {
    for (let n = Math.abs(m); n > 0;) {
      const q = Math.floor(n / 10);
      digitsScratch[len++] = n - q * 10;
      n = q;
    }
  }
  if (shift <= 0) {
    for (let i = len - 1; i >= 0; i--) out[at++] = ZERO + digitsScratch[i];
    for (let i = 0; i < -shift; i++) out[at++] = ZERO;
    return;
  }
  // Trailing zeros among the fraction's digits are not printed.
  let low = 0;
  while (low < shift && digitsScratch[low] === 0) low++;
  if (len <= shift) {
    out[at++] = ZERO;
    out[at++] = DOT;
    for (let i = shift; i > len; i--) out[at++] = ZERO;
    for (let i = len - 1; i >= low; i--) out[at++] = ZERO + digitsScratch[i];
    return;
  }
  for (let i = len - 1; i >= shift; i--) out[at++] = ZERO + digitsScratch[i];
  if (low === shift) return;
  out[at++] = DOT;
  for (let i = shift - 1; i >= low; i--) out[at++] = ZERO + digitsScratch[i];
}

/** The column's mantissas and their shifts, reused between columns (grown as needed). */
let mantissas = new Float64Array(4096);
let shifts = new Int32Array(4096);

/** Bytes a count's second difference takes at most: a comma, a sign and 16 digits. */
const MAX_STEP_BYTES = 18;

/** The two digits of 0 … 99 as ASCII, at 2·n and 2·n + 1. */
const DIGIT_PAIRS = Uint8Array.from({ length: 200 }, (_, i) =>
  i % 2 === 0 ? ZERO + Math.floor(i / 20) : ZERO + ((i >> 1) % 10),
);

/**
 * Writes `values` as JSON prints `packColumn(values, digits, …)`: a difference column, or
 * the plain rounded array where the column cannot be packed exactly. After the mantissas
 * (`columnMantissas`), one pass widens each to its count, checks it (a count beyond
 * `MAX_COUNT` sends the column plain: what is written so far is dropped) and writes its
 * second difference (`secondDifferences`' numbers: exact integers either way), into room
 * made once for the whole column, its digits two at a time backward from the last.
 */
function writePackedColumn(values: ArrayLike<number>, digits: number): void {
  const n = values.length;
  if (mantissas.length < n) {
    mantissas = new Float64Array(Math.max(n, 2 * mantissas.length));
    shifts = new Int32Array(mantissas.length);
  }
  const finest = columnMantissas(values, digits, mantissas, shifts);
  if (finest === undefined) return writeColumn(values, digits);
  const start = at;
  ascii(`{"decimals":${finest},"steps":[`);
  room(n * MAX_STEP_BYTES + 2);
  const o = out;
  const m = mantissas;
  const sh = shifts;
  let p = at;
  let before = 0;
  let step = 0;
  for (let i = 0; i < n; i++) {
    const k = countOf(m[i], sh[i], finest);
    if (k !== k) {
      at = start;
      return writeColumn(values, digits);
    }
    // The first count, then the first step, then each step's change.
    const s = k - before;
    let d = s - step;
    step = i === 0 ? 0 : s;
    before = k;
    if (i > 0) o[p++] = COMMA;
    if (d === 0) {
      o[p++] = ZERO;
      continue;
    }
    if (d < 0) {
      o[p++] = MINUS;
      d = -d;
    }
    if (d < 10) {
      o[p++] = ZERO + d;
      continue;
    }
    if (d < 2 ** 31) {
      let v = d | 0;
      let e = (p += v < 100 ? 2 : v < 1000 ? 3 : v < 10000 ? 4 : digitCount(v));
      while (v >= 100) {
        const q = (v / 100) | 0;
        const r = (v - q * 100) << 1;
        o[--e] = DIGIT_PAIRS[r + 1];
        o[--e] = DIGIT_PAIRS[r];
        v = q;
      }
      if (v >= 10) {
        o[--e] = DIGIT_PAIRS[2 * v + 1];
        o[--e] = DIGIT_PAIRS[2 * v];
      } else o[--e] = ZERO + v;
      continue;
    }
    let len = 0;
    for (let v = d; v > 0;) {
      const q = Math.floor(v / 10);
      digitsScratch[len++] = v - q * 10;
      v = q;
    }
    while (len > 0) o[p++] = ZERO + digitsScratch[--len];
  }
  at = p;
  ascii(']}');
}

/** The number of decimal digits of 0 < v < 2^31. */
function digitCount(v: number): number {
  let len = 1;
  while (v >= 10) {
    v = (v / 10) | 0;
    len++;
  }
  return len;
}

function writeColumn(values: ArrayLike<number>, digits: number): void {
  ascii('[');
  for (let i = 0; i < values.length; i++) {
    if (i > 0) {
      room(1);
      out[at++] = COMMA;
    }
    writeRounded(values[i], digits);
  }
  ascii(']');
}

type ColumnWriter = (values: ArrayLike<number>, digits: number) => void;

function writeNodeColumns(
  key: 'stepUpDb' | 'phaseDeg',
  sweep: SweepReport,
  nodes: SweepReport['nodes'],
  write: ColumnWriter,
): void {
  ascii(`,"${key}":[`);
  nodes.forEach((node, i) => {
    if (i > 0) ascii(',');
    write(nodeTraceValues(sweep, node, key), SWEEP_DIGITS);
  });
  ascii(']');
}

function writeOne(key: string, values: ArrayLike<number>, write: ColumnWriter): void {
  ascii(`,"${key}":`);
  write(values, SWEEP_DIGITS);
}

/**
 * The API's JSON answer as UTF-8 bytes: `head` (JSON text of an object without its sweep)
 * with the sweep's columns added as its last member, `sweep`, exactly as
 * JSON.stringify({ ...head, sweep: sweepToColumns(sweep, traces, nodes, packing) }) writes
 * it. The bytes are a view of a buffer the next call overwrites: compress or copy them first.
 */
export function answerWithSweepJson(
  head: string,
  sweep: SweepReport,
  traces: readonly SweepTrace[],
  nodes?: readonly number[],
  packing: SweepPacking = 'plain',
): Uint8Array {
  const write = packing === 'differences' ? writePackedColumn : writeColumn;
  const want = new Set(traces);
  const chosen = nodes ? sweep.nodes.filter((n) => nodes.includes(n.index)) : sweep.nodes;
  at = 0;
  // A maximum-size answer's buffer is not kept for the usual ones.
  if (out.length > 16 * USUAL_BYTES) out = Buffer.allocUnsafe(USUAL_BYTES);
  const open = head.length > 2 ? head.slice(0, -1) + ',' : '{';
  room(Buffer.byteLength(open));
  at += out.write(open, at, 'utf8');
  ascii(`"sweep":{"digits":${SWEEP_DIGITS},`);
  if (packing === 'differences') ascii('"packing":"differences",');
  // Each column read as a lazy trace's values (not settled into an array), written at once.
  ascii('"freqsHz":');
  write(traceValues(sweep, 'freqsHz'), FREQUENCY_DIGITS);
  ascii(`,"nodes":${JSON.stringify(chosen.map((n) => n.index))}`);
  if (want.has('stepUp')) writeNodeColumns('stepUpDb', sweep, chosen, write);
  if (want.has('phase')) writeNodeColumns('phaseDeg', sweep, chosen, write);
  if (want.has('zIn')) {
    writeOne('zInRe', traceValues(sweep, 'zInRe'), write);
    writeOne('zInIm', traceValues(sweep, 'zInIm'), write);
  }
  if (want.has('returnLoss')) writeOne('returnLossDb', traceValues(sweep, 'returnLossDb'), write);
  ascii('}}');
  return out.subarray(0, at);
}
