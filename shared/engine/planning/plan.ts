/**
 * The receiver plan of a chain: spurious responses of the first mixer, strong signals
 * (blocking, off-channel intermodulation, reciprocal mixing), the noise from outside at the
 * antenna, and the converter at the end — all from the same built chain, at the real
 * impedances and through the real selectivity ahead of each stage.
 */
import type { BuiltChain } from '../core/build';
import { findMixer, type MixerInfo } from '../core/selectivity';
import { T0_KELVIN, friis, noiseFloorDbm, sfdrDb } from '../core/noise';
import type { LevelsReport, NodeReport, SelectivityReport, StageReport } from '../types';
import { planningSchema, type PlanningSettings } from '../../schema/chain';
import { converterReport, type ConverterReport } from './converter';
import { externalNoise, type ExternalNoiseFigures } from './external-noise';
import { DEFAULT_MIXER_SUPPRESSION_DB } from './spur-frequencies';
import { spurChartByGang, type GangTuning } from './spur-chart-gang';
import { rankIfs, spurChart, spurResponses, type IfCandidate, type SpurChart, type SpurOptions, type SpurResponse } from './spurs'; // prettier-ignore
import {
  blocking,
  offChannelIntermod,
  phaseNoiseAt,
  reciprocalMixing,
  type BlockingReport,
  type IntermodReport,
  type ReciprocalMixingReport,
} from './strong-signals';

export interface ExternalNoiseReport extends ExternalNoiseFigures {
  environment: PlanningSettings['environment'];
  /** The receiver's own noise temperature referred to the antenna, T0·(F − 1), K. */
  receiverTempK: number;
  /** Antenna plus receiver, K. */
  systemTempK: number;
  /** k·Tsys·B at the antenna in the channel bandwidth, dBm. */
  noiseFloorAtAntennaDbm: number;
  /** How far the outside noise lies above the receiver's own, dB (null: no outside noise). */
  externalAboveReceiverDb: number | null;
  /** Sensitivity lost if the receiver's noise figure were 10 dB worse, dB. */
  costOfTenDbWorseNfDb: number;
  /** One plain sentence for the designer. */
  statement: string;
}

export interface PlanReport {
  settings: PlanningSettings;
  mixer: { stageId: string; loHz: number; ifHz: number; ifBandwidthHz: number } | null;
  spurs: SpurResponse[];
  spurChart: SpurChart | null;
  ifChoice: IfCandidate[];
  blocking: BlockingReport & {
    reciprocalMixingDbm: number | null;
    /**
     * Loss of sensitivity from the blocker (gain lost ahead of noisy stages and reciprocal
     * mixing), dB; null when a stage is blocked outright.
     */
    desensitisationDb: number | null;
  };
  intermod: IntermodReport & { sfdrDb: number | null; bySpacing: { spacingHz: number; iip3Dbm: number | null }[] }; // prettier-ignore
  reciprocalMixing: ReciprocalMixingReport | null;
  externalNoise: ExternalNoiseReport;
  converter: ConverterReport | null;
}

/** What the plan reads from the rest of the analysis. */
export interface PlanContext {
  nodes: NodeReport[];
  stages: StageReport[];
  selectivity: SelectivityReport[];
  levels: LevelsReport;
  /** The chain's marked gang, to chart spurs as the chain really tunes (optional). */
  tuning?: GangTuning | null;
}

const fmtMHz = (f: number) => `${Number((f / 1e6).toPrecision(4))} MHz`;
const ENV_WORDS: Record<PlanningSettings['environment'], string> = {
  business: 'in a business area',
  residential: 'in a residential area',
  rural: 'in a rural area',
  'quiet-rural': 'in a quiet rural area',
  none: 'with no man-made noise counted',
};

/** The planning inputs of a chain that states none: the schema's defaults, worked out once. */
const NO_PLANNING: PlanningSettings = planningSchema.parse({});

/**
 * The plan of a built chain. The spur chart across the tuning range and the IF choice cost
 * many more evaluations than the rest: they are worked out only when `full` is set.
 */
export function planChain(built: BuiltChain, ctx: PlanContext, full = false): PlanReport {
  const s = built.settings.planning ?? NO_PLANNING;
  const { f0Hz, channelBandwidthHz, temperatureK, thresholds, sweep } = built.settings;
  const mixer = findMixer(built);
  const last = ctx.selectivity[ctx.selectivity.length - 1];
  const ifBandwidthHz = last?.bw3dbHz ?? channelBandwidthHz;
  const opts: SpurOptions = {
    maxOrder: s.spurMaxOrder,
    targetDb: s.spurTargetDb,
    suppressionDb: s.mixerSuppressionDb ?? DEFAULT_MIXER_SUPPRESSION_DB,
    ifBandwidthHz,
  };
  const range: [number, number] = [s.tuningStartHz ?? sweep.startHz, s.tuningStopHz ?? sweep.stopHz]; // prettier-ignore
  const direct = mixer !== null && mixer.product === 'difference' && mixer.fInHz === f0Hz;
  const mixerNode = mixer ? built.twoPorts.findIndex((t) => t.id === mixer.stageId) : -1;

  const floorDbm = ctx.levels.noiseFloorDbm;
  const block = blocking(built, s.blockerOffsetHz, s.blockerLevelDbm, thresholds.compressionBackoffDb); // prettier-ignore
  const pn = phaseNoiseAt(s.loPhaseNoise, Math.abs(s.blockerOffsetHz));
  const rm =
    mixer && mixerNode >= 0 && pn !== null
      ? reciprocalMixing(built, mixerNode, s.blockerOffsetHz, s.blockerLevelDbm, pn, channelBandwidthHz, floorDbm) // prettier-ignore
      : null;
  const desensitisationDb = desensitisation({ ...ctx, bandwidthHz: channelBandwidthHz }, block, rm?.noiseAtAntennaDbm ?? null); // prettier-ignore

  const im = offChannelIntermod(built, s.toneSpacingHz);
  const spacings = [0.25, 0.5, 1, 2, 4, 8].map((k) => k * s.toneSpacingHz);
  const bySpacing = spacings.map((sp) => ({ spacingHz: sp, iip3Dbm: offChannelIntermod(built, sp).effectiveIip3Dbm })); // prettier-ignore

  return {
    settings: s,
    mixer: mixer
      ? { stageId: mixer.stageId, loHz: mixer.loHz, ifHz: mixer.ifHz, ifBandwidthHz }
      : null,
    spurs: mixer ? spurResponses(built, mixer, opts) : [],
    spurChart:
      full && direct && mixer ? chartOf(built, mixer, mixerNode, opts, range, ctx.tuning) : null,
    ifChoice: full && direct && mixer ? rankIfs(built, mixer, opts, range, s.ifCandidatesHz) : [],
    blocking: { ...block, reciprocalMixingDbm: rm?.noiseAtAntennaDbm ?? null, desensitisationDb },
    intermod: { ...im, sfdrDb: im.effectiveIip3Dbm === null ? null : sfdrDb(im.effectiveIip3Dbm, floorDbm), bySpacing }, // prettier-ignore
    reciprocalMixing: rm,
    externalNoise: outsideNoise(f0Hz, s, ctx.levels, channelBandwidthHz, temperatureK),
    converter: converterOf(built, ctx, s),
  };
}

/** The spur chart: by the chain's marked gang when it has one, else at constant Q. */
function chartOf(
  built: BuiltChain,
  mixer: MixerInfo,
  mixerNode: number,
  opts: SpurOptions,
  range: [number, number],
  tuning: GangTuning | null | undefined,
): SpurChart {
  if (!tuning) return spurChart(built, mixer, opts, range, 41);
  const { startHz, stopHz } = built.settings.sweep;
  const search: [number, number] = [
    Math.min(startHz, range[0]) / 2,
    Math.max(stopHz, range[1]) * 2,
  ];
  return spurChartByGang(mixer, mixerNode, opts, tuning, search);
}

/**
 * Sensitivity lost to a blocker: the Friis cascade again with each stage's gain reduced by
 * what the blocker takes from it (noise added after a compressed stage is no longer
 * outweighed by its gain), plus the reciprocal-mixing noise referred to the antenna, against
 * the receiver's own noise: 10·log10((F' + N_rm/kT0B) / F).
 */
function desensitisation(ctx: PlanContext & { bandwidthHz: number }, block: BlockingReport, rmAtAntennaDbm: number | null): number | null {
  if (block.blocked) return null;
  const loss = new Map(block.stages.map((b) => [b.stageId, b.gainLossDb ?? 0]));
  const gains = ctx.stages.map((st) => Math.pow(10, (st.availableGainDb - (loss.get(st.id) ?? 0)) / 10));
  const factors = ctx.stages.map((st) => Math.pow(10, st.noiseFigureDb / 10));
  const ok = gains.every(Number.isFinite) && factors.every(Number.isFinite);
  const f = Math.pow(10, ctx.levels.noiseFigureDb / 10);
  const fBlocked = ok && gains.length > 0 ? Math.max(f, friis(gains, factors).at(-1)!) : f;
  const kT0B = noiseFloorDbm(T0_KELVIN, ctx.bandwidthHz, 0);
  const rm = rmAtAntennaDbm === null ? 0 : Math.pow(10, (rmAtAntennaDbm - kT0B) / 10);
  return 10 * Math.log10((fBlocked + rm) / f);
} // prettier-ignore

function outsideNoise(
  f0Hz: number,
  s: PlanningSettings,
  levels: LevelsReport,
  bandwidthHz: number,
  temperatureK: number,
): ExternalNoiseReport {
  const ext = externalNoise(f0Hz, { environment: s.environment, galactic: s.galactic, atmosphericFaDb: s.atmosphericFaDb }); // prettier-ignore
  const f = Math.pow(10, levels.noiseFigureDb / 10);
  const receiverTempK = T0_KELVIN * (f - 1);
  const systemTempK = ext.antennaTempK + receiverTempK;
  const worseTempK = T0_KELVIN * (10 * f - 1);
  const costOfTenDbWorseNfDb = 10 * Math.log10((ext.antennaTempK + worseTempK) / systemTempK);
  const noiseFloorAtAntennaDbm = noiseFloorDbm(systemTempK > 0 ? systemTempK : temperatureK, bandwidthHz, 0); // prettier-ignore
  const above = ext.antennaTempK > 0 && receiverTempK > 0 ? 10 * Math.log10(ext.antennaTempK / receiverTempK) : null; // prettier-ignore
  const where = `At ${fmtMHz(f0Hz)} ${ENV_WORDS[s.environment]}`;
  const statement =
    above === null
      ? `${where} no outside noise is counted: the receiver's own noise (${receiverTempK.toFixed(0)} K) sets the floor.`
      : above >= 0
        ? `${where} the outside noise is ${above.toFixed(1)} dB above what this receiver adds: a receiver 10 dB noisier would cost ${costOfTenDbWorseNfDb.toFixed(costOfTenDbWorseNfDb < 0.1 ? 2 : 1)} dB of sensitivity.`
        : `${where} the receiver adds ${(-above).toFixed(1)} dB more noise than arrives from outside: a lower noise figure still buys sensitivity here.`; // prettier-ignore
  return {
    ...ext,
    environment: s.environment,
    receiverTempK,
    systemTempK,
    noiseFloorAtAntennaDbm,
    externalAboveReceiverDb: above,
    costOfTenDbWorseNfDb,
    statement,
  };
}

function converterOf(built: BuiltChain, ctx: PlanContext, s: PlanningSettings): ConverterReport | null {
  const c = built.load.model.converter;
  if (!c) return null;
  const lastNode = ctx.nodes[ctx.nodes.length - 1];
  return converterReport({
    ...c,
    processingBandwidthHz: c.processingBandwidthHz > 0 ? c.processingBandwidthHz : built.settings.channelBandwidthHz, // prettier-ignore
    gainDb: lastNode.transducerGainDb,
    frontEndNfDb: ctx.levels.noiseFigureDb,
    temperatureK: built.settings.temperatureK,
    strongestDbm: s.strongestSignalDbm,
    requiredSnrDb: built.settings.requiredSnrDb,
  });
} // prettier-ignore
