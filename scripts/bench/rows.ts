/**
 * The benchmark's rows and the context every section gets. A section measures, then adds
 * rows; each row carries the 1-minute load average at the moment its figure was taken, so
 * a figure measured on a busy machine says so.
 */
import { statSync } from 'node:fs';
import { loadavg } from 'node:os';

export type Verdict = 'PASS' | 'MISS' | '';

export interface BenchRow {
  figure: string;
  value: string;
  /** The target as text ("≤ 3×"), or "—" for a figure without one. */
  target: string;
  verdict: Verdict;
  /** 1-minute load average when the figure was taken. */
  load: number;
}

export interface BenchContext {
  /** Fewer repetitions (for a quick look; the figures are noisier). */
  quick: boolean;
  /** The project folder. */
  root: string;
  /** Adds a row, stamped with the load average now. */
  row(figure: string, value: string, target?: string, verdict?: Verdict): void;
}

/** A section of the benchmark: measures and adds its rows (may be async). */
export interface BenchSection {
  /** Short name, for `npm run bench -- --only <name>`. */
  name: string;
  run(ctx: BenchContext): void | Promise<void>;
}

export const verdict = (ok: boolean): Verdict => (ok ? 'PASS' : 'MISS');
export const ms = (v: number) =>
  Number.isFinite(v) ? `${v < 1 ? v.toFixed(3) : v < 100 ? v.toFixed(1) : v.toFixed(0)} ms` : '—';
export const kib = (b: number) => `${(b / 1024).toFixed(1)} KiB`;
export const mib = (b: number) => `${(b / 1024 / 1024).toFixed(0)} MiB`;
export const loadNow = () => loadavg()[0];

/**
 * When a browser run took the figure in `file` (its `measuredAt`, "YYYY-MM-DD HH:MM" UTC),
 * or, for a file written before runs said so, the file's modification time (which a copy
 * of the file without its times moves to the moment of the copy).
 */
export function measuredWhen(file: string, data: { measuredAt?: unknown }): string {
  const at = typeof data.measuredAt === 'string' ? new Date(data.measuredAt) : undefined;
  const when = at && !Number.isNaN(at.getTime()) ? at : statSync(file).mtime;
  return when.toISOString().slice(0, 16).replace('T', ' ');
}
