/**
 * Pure views of the receiver plan for the Plan tab: the spur chart as a Plotly figure, the
 * spur table's rows and their sort, and the phase-noise profile as text and back.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { PlanReport } from '../../../../../shared/engine/planning/plan';
import type { SpurResponse } from '../../../../../shared/engine/planning/spurs';
import { linearAxisTicks, logAxisTicks } from '../results/plot-axes';
import { decibels, engineering, fieldText, nominalDecibels } from '../results/format-quantity';
import type { PlotPalette } from '../results/plot-theme';
import type { PlotFigure } from '../results/plot-traces';

export const KIND_LABEL: Record<string, string> = {
  image: 'Image',
  'half-if': 'Half-IF',
  'if-feedthrough': 'IF feed-through',
  'lo-harmonic': 'LO harmonic',
  spur: 'Spur',
  wanted: 'Wanted',
};

/** Colour class of a rejection against the target: meets, within 10 dB of it, or below. */
export function rejectionBand(db: number | null, targetDb: number): 'ok' | 'near' | 'bad' | 'none' {
  if (db === null) return 'none';
  if (db >= targetDb) return 'ok';
  return db >= targetDb - 10 ? 'near' : 'bad';
}

/**
 * The spur chart: dial frequency across, each response's input frequency up, one line per
 * (m, n) response, coloured by its worst rejection against the target; the wanted signal
 * is the diagonal.
 */
export function spurChartFigure(plan: PlanReport, palette: PlotPalette): PlotFigure | null {
  const chart = plan.spurChart;
  if (!chart) return null;
  const target = plan.settings.spurTargetDb;
  const colour = { ok: palette.series[0], near: palette.warn, bad: '#b3304a', none: palette.axis };
  const dial = chart.dialHz;
  const hz = (v: number | null) =>
    v === null || !Number.isFinite(v) ? '—' : engineering(v, 'hertz');
  const data: Data[] = [
    { x: dial, y: dial, type: 'scatter', mode: 'lines', name: 'Wanted (dial)', line: { color: palette.text, width: 2, dash: 'dot' }, hoverinfo: 'skip' }, // prettier-ignore
  ];
  const rfAll: number[] = [...dial];
  for (const line of chart.lines) {
    const rej = line.rejectionDb.filter((v): v is number => v !== null);
    const worst = rej.length ? Math.min(...rej) : null;
    const band = rejectionBand(worst, target);
    const rf = line.rfHz.map((v) => (Number.isFinite(v) ? v : null));
    for (const v of rf) if (v !== null && v > 0) rfAll.push(v);
    data.push({
      x: dial,
      y: rf,
      type: 'scatter',
      mode: 'lines',
      name: `${KIND_LABEL[line.kind] ?? line.kind} ${line.m}×LO ${line.n}×RF${worst === null ? '' : ` (≥ ${decibels(worst)})`}`, // prettier-ignore
      line: { color: colour[band], width: band === 'ok' ? 1 : 2.5 },
      // The hover text is written here, as every table writes figures (prefix, unit, the
      // user's significant figures), rather than with Plotly's own number format.
      customdata: dial.map((d, i) => [hz(d), hz(rf[i]), decibels(line.rejectionDb[i])]),
      hovertemplate: '%{fullData.name}<br>dial %{customdata[0]} → %{customdata[1]}<br>rejection %{customdata[2]}<extra></extra>', // prettier-ignore
    });
  }
  const layout: Partial<Layout> = {
    title: {
      text: `Spurious responses across the tuning range (target ${nominalDecibels(target)}; ${chart.tuning === 'gang' ? 'preselector tuned by the chain’s gang' : 'preselector assumed at constant Q'})`, // prettier-ignore
    },
    paper_bgcolor: palette.background,
    plot_bgcolor: palette.background,
    font: { family: palette.fontFamily, color: palette.text, size: 12 },
    xaxis: { title: { text: 'Dial frequency' }, gridcolor: palette.grid, linecolor: palette.axis, ...(linearAxisTicks(dial, 'hertz') ?? {}) }, // prettier-ignore
    yaxis: { title: { text: 'Input frequency of the response' }, gridcolor: palette.grid, linecolor: palette.axis, type: 'log', ...(logAxisTicks(rfAll, 'hertz') ?? {}) }, // prettier-ignore
    margin: { l: 70, r: 20, t: 40, b: 50 },
    legend: { font: { size: 10 } },
  };
  return { data, layout, tickUnits: { xaxis: 'hertz', yaxis: 'hertz' } };
}

export type SpurSortKey = 'rejection' | 'frequency' | 'order';

/** The spur table sorted by a column (rejection ascending, frequency, or order). */
export function sortSpurs(spurs: readonly SpurResponse[], key: SpurSortKey): SpurResponse[] {
  const by: Record<SpurSortKey, (a: SpurResponse, b: SpurResponse) => number> = {
    rejection: (a, b) => (a.rejectionDb ?? Infinity) - (b.rejectionDb ?? Infinity),
    frequency: (a, b) => (a.rfHz ?? 0) - (b.rfHz ?? 0),
    order: (a, b) => a.order - b.order || (a.rejectionDb ?? Infinity) - (b.rejectionDb ?? Infinity),
  };
  return [...spurs].sort(by[key]);
}

/** "1 kHz: −90, 10 kHz: −110" ⇄ the profile; null with a message when a part does not read. */
export function profileText(profile: readonly { offsetHz: number; dbcHz: number }[]): string {
  return profile.map((p) => `${fieldText(p.offsetHz, 'hertz')}: ${p.dbcHz}`).join(', ');
}

export function parseProfile(
  text: string,
  parseHz: (t: string) => number | null,
): { ok: true; profile: { offsetHz: number; dbcHz: number }[] } | { ok: false; message: string } {
  const parts = text.split(/[,;]/).map((p) => p.trim()).filter(Boolean); // prettier-ignore
  const profile: { offsetHz: number; dbcHz: number }[] = [];
  for (const part of parts) {
    const [f, l] = part.split(':').map((s) => s.trim());
    const offsetHz = f === undefined ? null : parseHz(f);
    const dbcHz = l === undefined || l === '' ? NaN : Number(l.replace('−', '-'));
    if (
      offsetHz === null ||
      !(offsetHz > 0) ||
      !Number.isFinite(dbcHz) ||
      dbcHz > 0 ||
      dbcHz < -250
    ) {
      return { ok: false, message: `"${part}": write offset: level, e.g. "10 kHz: -110" (dBc/Hz, 0 to −250)` }; // prettier-ignore
    }
    profile.push({ offsetHz, dbcHz });
  }
  if (profile.length > 16) return { ok: false, message: 'at most 16 points' };
  return { ok: true, profile };
}
