/**
 * Axis ticks written the way the tables write values: engineering prefixes and the unit
 * ("1 kΩ", "10 kΩ", "100 kΩ"), not raw numbers or Plotly's own exponent forms. Plotly takes
 * them as an array of tick positions with their text (`tickmode: 'array'`).
 */
import type { UnitKind } from '../../../../../shared/engine/types';
import { tickLabel } from './format-quantity';

/** The unit of each axis ticked by these helpers, so a zoom or pan can re-tick it. */
export type AxisUnits = Partial<Record<'xaxis' | 'yaxis', UnitKind>>;

export interface AxisTicks {
  tickmode: 'array';
  tickvals: number[];
  ticktext: string[];
}

/** Mantissas per decade: every decade always; 2 and 5 too when few decades are shown. */
function mantissas(decades: number): number[] {
  if (decades <= 1) return [1, 2, 3, 5, 7];
  if (decades <= 3) return [1, 2, 5];
  return [1];
}

/**
 * Ticks for a log axis spanning the positive finite `values`: 1-2-5 steps, or decades when
 * the span is wide, each labelled with a prefix and the unit. Empty when no value is usable
 * (Plotly then chooses its own).
 */
export function logAxisTicks(values: ArrayLike<number>, kind: UnitKind): AxisTicks | null {
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isFinite(v) && v > 0) {
      low = Math.min(low, v);
      high = Math.max(high, v);
    }
  }
  if (!(low <= high)) return null;
  const first = Math.floor(Math.log10(low));
  const last = Math.ceil(Math.log10(high));
  const steps = mantissas(Math.max(1, last - first));
  const tickvals: number[] = [];
  for (let d = first; d <= last; d++) {
    for (const m of steps) {
      // Rounded to 12 figures so 3 × 10⁻⁶ does not print as 2.9999999 µ.
      const v = Number((m * 10 ** d).toPrecision(12));
      if (v >= low / 1.0001 && v <= high * 1.0001) tickvals.push(v);
    }
  }
  // A span inside one step still needs two labels to be read.
  if (tickvals.length < 2) tickvals.splice(0, tickvals.length, low, high);
  return {
    tickmode: 'array',
    tickvals,
    ticktext: tickvals.map((v) => tickLabel(v, kind, 3)),
  };
}

/** The finite values' low and high, or null when there are none. */
function span(values: Iterable<number | null | undefined>): [number, number] | null {
  let low = Infinity;
  let high = -Infinity;
  for (const v of values) {
    if (typeof v === 'number' && Number.isFinite(v)) {
      low = Math.min(low, v);
      high = Math.max(high, v);
    }
  }
  return low <= high ? [low, high] : null;
}

/**
 * Ticks for a linear axis over the finite `values`: about `target` steps of 1, 2 or 5 times
 * a power of ten, each labelled with a prefix and the unit ("10.2 MHz", "−5 kHz"), with as
 * many figures as the step needs to tell neighbours apart. Null when no value is usable.
 */
export function linearAxisTicks(
  values: Iterable<number | null | undefined>,
  kind: UnitKind,
  target = 6,
): AxisTicks | null {
  const range = span(values);
  if (!range) return null;
  let [low, high] = range;
  if (low === high) {
    // All zero (a perfect tracking error): ±5 units, so the ticks are whole units rather
    // than "500 mHz", which reads too much like megahertz.
    const pad = Math.abs(low) * 0.01 || 5;
    [low, high] = [low - pad, high + pad];
  }
  const rough = (high - low) / target;
  const power = 10 ** Math.floor(Math.log10(rough));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= rough) ?? 10 * power;
  const first = Math.ceil(low / step - 1e-9);
  const last = Math.floor(high / step + 1e-9);
  const tickvals: number[] = [];
  // Rounded to 12 figures so 0.3 MHz does not print as 299.99999 kHz; an exact zero stays 0.
  for (let i = first; i <= last; i++) tickvals.push(i === 0 ? 0 : Number((i * step).toPrecision(12))); // prettier-ignore
  const largest = Math.max(Math.abs(low), Math.abs(high));
  const digits = Math.max(1, Math.floor(Math.log10(largest)) - Math.floor(Math.log10(step)) + 1);
  return {
    tickmode: 'array',
    tickvals,
    ticktext: tickvals.map((v) => tickLabel(v, kind, Math.min(digits, 12))),
  };
}

/** What a zoom or pan asks of one axis: a new range, back to the data's own span, or nothing. */
export type AxisRangeChange = { range: [number, number] } | 'reset' | null;

/**
 * Reads one axis's change from a Plotly relayout event, which names the range either as
 * `xaxis.range[0]` / `xaxis.range[1]` or as `xaxis.range: [a, b]`, and a double-click reset
 * as `xaxis.autorange: true`. On a log axis the numbers are log10 of the values.
 */
export function axisRangeChange(
  event: Record<string, unknown>,
  axis: 'xaxis' | 'yaxis',
): AxisRangeChange {
  if (event[`${axis}.autorange`] === true) return 'reset';
  const pair = event[`${axis}.range`];
  const [a, b] = Array.isArray(pair)
    ? (pair as unknown[])
    : [event[`${axis}.range[0]`], event[`${axis}.range[1]`]];
  if (typeof a !== 'number' || typeof b !== 'number') return null;
  if (!Number.isFinite(a) || !Number.isFinite(b) || a === b) return null;
  return { range: a < b ? [a, b] : [b, a] };
}

/**
 * Ticks for a zoomed or panned axis showing `range` (log10 of the ends when `log`), with the
 * same steps and labels as the ticks computed from the data.
 */
export function ticksForRange(
  range: readonly [number, number],
  log: boolean,
  kind: UnitKind,
): AxisTicks | null {
  if (!log) return linearAxisTicks(range, kind);
  return logAxisTicks([10 ** range[0], 10 ** range[1]], kind);
}

/**
 * The tick update for a relayout event: new ticks on each axis in `units` whose range the
 * event changed, the data's own ticks (`base`) on a reset. Null when nothing changes, as
 * for the event our own tick update raises (it sets no range), so there is no loop.
 */
export function retickUpdate(
  event: Record<string, unknown>,
  units: AxisUnits,
  base: Partial<Record<'xaxis' | 'yaxis', { type?: unknown; tickvals?: unknown; ticktext?: unknown }>>, // prettier-ignore
): Record<string, unknown> | null {
  const update: Record<string, unknown> = {};
  for (const axis of ['xaxis', 'yaxis'] as const) {
    const kind = units[axis];
    const change = kind ? axisRangeChange(event, axis) : null;
    if (!kind || !change) continue;
    const ticks =
      change === 'reset'
        ? { tickvals: base[axis]?.tickvals, ticktext: base[axis]?.ticktext }
        : ticksForRange(change.range, base[axis]?.type === 'log', kind);
    if (!ticks?.tickvals || !ticks.ticktext) continue;
    update[`${axis}.tickvals`] = ticks.tickvals;
    update[`${axis}.ticktext`] = ticks.ticktext;
  }
  return Object.keys(update).length > 0 ? update : null;
}
