/**
 * The CLI's sweep-table cells, written as bytes, are exactly what `toFixed(3)` and the
 * engine's formatter (`formatNumber`) give, aligned as `padStart`/`padEnd` align them; and
 * the whole table is the text those strings would make.
 */
import { closeSync, mkdtempSync, openSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ByteSink } from '../../scripts/cli/byte-sink';
import { cellText, putFixed3, putSignificant } from '../../scripts/cli/number-bytes';
import { writeSweepTable } from '../../scripts/cli/stream-sweep';
import { formatNumber, type SweepReport } from '../../shared/engine';

/** A small deterministic generator (a linear congruential one), so a failure repeats. */
function values(count: number, seed = 12345): number[] {
  let x = seed;
  const next = () => (x = (x * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  return Array.from({ length: count }, () => (next() - 0.5) * 10 ** (24 * next() - 12));
}

const significant = (v: number, digits: number, width = 14, left = false) =>
  cellText((buf, pos) => putSignificant(buf, pos, [v], 0, digits, width, left));
const fixed3 = (v: number, width = 14) =>
  cellText((buf, pos) => putFixed3(buf, pos, [v], 0, width, '—'));

// Ties of the exact decimal, values either side of powers of ten, and the special values.
const EDGES = [12345678.5, -12345678.5, 1234567.25, 2.5, -2.5, 999999999.5, 99999.95, 1e21,
  1e-300, 9.9999999999, 0.00099999999999, 1000, -1000, 0, -0, Infinity, -Infinity, NaN,
  1e-6, 9.99999e-7, 0.0005, -0.0005, 0.0015, 1.0005, 2.0005, -0.0001, 999.9996, 1e9, 1e15]; // prettier-ignore

describe('sweep-table cells as bytes', () => {
  it.each([6, 9])('should give formatNumber’s text for %i digits over a wide spread', (digits) => {
    const differ = values(200_000).filter(
      (v) => significant(v, digits) !== formatNumber(v, digits).padStart(14),
    );
    expect(differ).toEqual([]);
  });

  it('should give toFixed(3) for decibel values across their range', () => {
    const spread = values(200_000, 777).map((v) => v / 1e6);
    const differ = spread.filter((v) => fixed3(v) !== v.toFixed(3).padStart(14));
    expect(differ).toEqual([]);
  });

  it('should round exact halves and keep the special values as the methods do', () => {
    for (const v of EDGES) {
      for (const digits of [6, 9]) {
        expect([v, significant(v, digits)]).toEqual([v, formatNumber(v, digits).padStart(14)]);
      }
      const want = Number.isFinite(v) ? v.toFixed(3) : '—';
      expect([v, fixed3(v)]).toEqual([v, want.padStart(14)]);
    }
  });

  it('should align left when asked and let a long value overflow its column', () => {
    expect(significant(7e6, 9, 14, true)).toBe('7000000'.padEnd(14));
    expect(significant(-1.5e-7, 6, 14, true)).toBe('-1.5e-7'.padEnd(14));
    expect(fixed3(-123456789.0004, 6)).toBe('-123456789.000');
    expect(significant(123456.7, 6, 3)).toBe('123457');
  });

  it('should give formatNumber’s text on a logarithmic frequency grid', () => {
    const grid = Array.from({ length: 100_000 }, (_, i) => 1e6 * 30 ** (i / 99_999));
    expect(grid.filter((f) => significant(f, 9) !== formatNumber(f, 9).padStart(14))).toEqual([]);
  });
});

describe('the sweep table written as bytes', () => {
  /** The table as strings: each cell as toFixed/formatNumber give it, padded as padStart/padEnd. */
  function tableText(sweep: SweepReport): string {
    const header = ['f (Hz)', ...sweep.nodes.map((n) => `n${n.index} (dB)`), 'Zin re (Ω)', 'Zin im (Ω)']; // prettier-ignore
    const w = header.map((h) => Math.max(14, h.length));
    const line = (cells: string[]) =>
      cells.map((c, k) => (k === 0 ? c.padEnd(w[0]) : c.padStart(w[k]))).join('  ');
    const rows = sweep.freqsHz.map((f, i) =>
      line([
        formatNumber(f, 9),
        ...sweep.nodes.map((n) => (Number.isFinite(n.stepUpDb[i]) ? n.stepUpDb[i].toFixed(3) : '—')), // prettier-ignore
        formatNumber(sweep.zIn.re[i], 6),
        formatNumber(sweep.zIn.im[i], 6),
      ]),
    );
    return [line(header).trimEnd(), ...rows].join('\n') + '\n';
  }

  it('should write every row as the strings would, across buffer flushes and overflowing cells', () => {
    const P = 3000;
    const wild = [...EDGES, 1e300, -1e-300, -123456789012.5, 5e-7];
    const pick = (seed: number) => {
      const spread = values(P, seed);
      // Every so often a special or overflowing value, so rows of odd length come between.
      return spread.map((v, i) => (i % 37 === 0 ? wild[(i / 37) % wild.length] : v));
    };
    const sweep: SweepReport = {
      freqsHz: pick(1).map((v, i) => (i % 37 === 0 ? v : 1e6 + 1e3 * i + Math.abs(v))),
      nodes: [0, 1, 2, 3].map((index) => ({
        index,
        stepUpDb: pick(10 + index).map((v) => (Math.abs(v) > 1e6 ? v : v / 1e3)),
        phaseDeg: new Array<number>(P).fill(0),
      })),
      zIn: { re: pick(20), im: pick(21) },
      returnLossDb: new Array<number>(P).fill(0),
    };
    const dir = mkdtempSync(join(tmpdir(), 'cw-table-'));
    try {
      const file = join(dir, 'table.txt');
      const fd = openSync(file, 'w');
      const out = new ByteSink(fd);
      // Text before the table leaves the buffer holding something other than spaces.
      out.text('x'.repeat(70_000) + '\n');
      writeSweepTable(sweep, out);
      out.flush();
      closeSync(fd);
      const text = readFileSync(file, 'utf8');
      expect(text.length).toBeGreaterThan(3 * 65_536);
      const got = text.slice(70_001).split('\n');
      const want = tableText(sweep).split('\n');
      expect(got.length).toBe(want.length);
      expect(got.filter((row, i) => row !== want[i])).toEqual([]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
