/**
 * The receiver plan as aligned plain text (the CLI with `--plan`) and as CSV rows (the
 * editor's download): spurious responses, strong signals, outside noise and the converter.
 */
import { formatQuantity } from '../engine/core/format';
import type { PlanReport } from '../engine/planning/plan';
import { alignColumns } from './budget-text';

const DASH = '—';
const dec = (v: number | null | undefined, places = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? DASH : v.toFixed(places);
const hz = (v: number | null | undefined) => (v === null || v === undefined ? 'any' : formatQuantity(v, 'hertz', 4)); // prettier-ignore

/** Rows of the spur table, header first. */
export function spurRows(plan: PlanReport): string[][] {
  return [
    ['Response', 'm×LO', 'n×RF', 'Order', 'Input frequency', 'Selectivity (dB)', 'Mixer suppression (dB)', 'Rejection (dB)', 'Meets target'], // prettier-ignore
    ...plan.spurs.map((s) => [s.kind, String(s.m), String(s.n), String(s.order), hz(s.rfHz), dec(s.selectivityDb), dec(s.suppressionDb), dec(s.rejectionDb), s.meetsTarget === null ? DASH : s.meetsTarget ? 'yes' : 'no']), // prettier-ignore
  ];
}

/** Rows of the strong-signal, outside-noise and converter figures: [figure, value, unit]. */
export function planFigureRows(plan: PlanReport): string[][] {
  const b = plan.blocking;
  const im = plan.intermod;
  const ext = plan.externalNoise;
  const c = plan.converter;
  const rows: string[][] = [
    ['Figure', 'Value', 'Unit'],
    ['Blocker offset', String(b.offsetHz), 'Hz'],
    ['Blocker level at the antenna', dec(b.levelDbm), 'dBm'],
    ['First stage to compress', b.firstCompressing ?? 'none', ''],
    ['Desensitisation', b.desensitisationDb === null ? 'blocked' : dec(b.desensitisationDb, 2), 'dB'], // prettier-ignore
    ['Reciprocal-mixing noise at the antenna', dec(b.reciprocalMixingDbm), 'dBm'],
    ['Tone spacing', String(im.spacingHz), 'Hz'],
    ['Off-channel IIP3', dec(im.effectiveIip3Dbm), 'dBm'],
    ['Off-channel SFDR', dec(im.sfdrDb), 'dB'],
    ['Outside noise Fa (total)', dec(ext.totalFaDb), 'dB above kT0B'],
    ['Antenna noise temperature', dec(ext.antennaTempK, 0), 'K'],
    ['Receiver noise temperature', dec(ext.receiverTempK, 0), 'K'],
    ['System noise temperature', dec(ext.systemTempK, 0), 'K'],
    ['Noise floor at the antenna', dec(ext.noiseFloorAtAntennaDbm), 'dBm'],
  ];
  if (plan.reciprocalMixing) {
    rows.push(['Blocker for reciprocal mixing at the floor', dec(plan.reciprocalMixing.blockerForFloorDbm), 'dBm']); // prettier-ignore
  }
  if (c) {
    rows.push(
      ['Converter full scale', dec(c.fullScaleDbm), 'dBm'],
      ['Converter noise at the antenna', dec(c.noiseAtAntennaDbm), 'dBm'],
      ['Front-end noise at the antenna', dec(c.frontEndNoiseAtAntennaDbm), 'dBm'],
      ['System noise figure with the converter', dec(c.systemNfDb, 2), 'dB'],
      ['Converter headroom', dec(c.headroomDb), 'dB'],
      ['Gain-control range needed', dec(c.agcRangeDb), 'dB'],
    );
  }
  return rows;
}

/** The plan as text for the CLI. */
export function planText(plan: PlanReport): string {
  const lines = ['Receiver plan'];
  if (plan.mixer) {
    lines.push(`First mixer: LO ${hz(plan.mixer.loHz)}, IF ${hz(plan.mixer.ifHz)} (pass-band ${hz(plan.mixer.ifBandwidthHz)})`, '', alignColumns(spurRows(plan))); // prettier-ignore
  } else {
    lines.push('No mixer: no spurious responses.');
  }
  lines.push('', alignColumns(planFigureRows(plan)), '', plan.externalNoise.statement);
  return lines.join('\n');
}
