/**
 * Flags from the receiver plan: a spurious response below the chain's target, a blocker that
 * compresses a stage, and a converter that sets the noise floor or clips.
 */
import { formatNumber as num, hz } from '../core/format';
import type { Flag } from '../types';
import type { PlanReport } from './plan';

const KIND_WORDS: Record<string, string> = {
  image: 'image',
  'half-if': 'half-IF response',
  'if-feedthrough': 'IF feed-through',
  'lo-harmonic': 'LO harmonic in the IF passband',
  spur: 'spurious response',
};

/**
 * The plan's flags. Spur and blocking flags need the chain's own planning settings (a
 * target and a blocker the designer stated); the converter's need only the converter stage.
 */
export function planFlags(plan: PlanReport, loadId: string, stated: boolean): Flag[] {
  const flags: Flag[] = [];
  const { spurs, blocking, converter, mixer, settings } = plan;
  const missing = stated ? spurs.filter((s) => s.meetsTarget === false) : [];
  if (mixer && missing.length > 0) {
    const w = missing[0];
    const at = w.rfHz === null ? 'whatever the input' : `at ${hz(w.rfHz)}`;
    const more = missing.length > 1 ? ` ${missing.length - 1} more below the target are listed in the plan.` : ''; // prettier-ignore
    flags.push({
      code: 'spur-response',
      severity: 'warning',
      stageId: mixer.stageId,
      message: `The ${KIND_WORDS[w.kind] ?? w.kind} (${w.m}×LO, ${w.n}×RF) ${at} is rejected by only ${num(w.rejectionDb ?? 0, 3)} dB, under the ${num(settings.spurTargetDb, 3)} dB target (selectivity ahead of the mixer ${num(w.selectivityDb ?? 0, 3)} dB, mixer suppression ${num(w.suppressionDb, 3)} dB).${more}`, // prettier-ignore
      data: { m: w.m, n: w.n, rfHz: w.rfHz ?? 'any', rejectionDb: w.rejectionDb ?? 'unknown', targetDb: settings.spurTargetDb }, // prettier-ignore
    });
  }
  const first = stated ? blocking.stages.find((s) => s.compresses) : undefined;
  if (first) {
    flags.push({
      code: 'blocking',
      severity: 'warning',
      stageId: first.stageId,
      message: `A ${num(blocking.levelDbm, 3)} dBm signal ${hz(Math.abs(blocking.offsetHz))} ${blocking.offsetHz > 0 ? 'above' : 'below'} the design frequency reaches "${first.label}" at ${num(first.inputDbm, 3)} dBm, past its P1dB less the back-off by ${num(-(first.headroomDb ?? 0), 3)} dB: it compresses first, and the wanted signal loses ${blocking.desensitisationDb !== null ? `${num(blocking.desensitisationDb, 3)} dB of sensitivity` : 'all sensitivity (blocked)'}.`, // prettier-ignore
      data: { inputDbm: first.inputDbm, p1dbDbm: first.p1dbDbm ?? 'none', desensitisationDb: blocking.desensitisationDb ?? 'blocked' }, // prettier-ignore
    });
  }
  if (converter?.converterSetsFloor) {
    flags.push({
      code: 'converter-floor',
      severity: 'warning',
      stageId: loadId,
      message: `The converter's noise, ${num(converter.noiseAtAntennaDbm, 3)} dBm referred to the antenna, is above the front end's ${num(converter.frontEndNoiseAtAntennaDbm, 3)} dBm in ${hz(converter.processingBandwidthHz)}: the converter, not the front end, sets the noise floor (system noise figure ${num(converter.systemNfDb, 3)} dB). More gain ahead of it, or a quieter converter, would help.`, // prettier-ignore
      data: { noiseAtAntennaDbm: converter.noiseAtAntennaDbm, frontEndNoiseAtAntennaDbm: converter.frontEndNoiseAtAntennaDbm }, // prettier-ignore
    });
  }
  if (converter?.clips) {
    flags.push({
      code: 'converter-clips',
      severity: 'error',
      stageId: loadId,
      message: `The strongest stated signal (${num(settings.strongestSignalDbm, 3)} dBm at the antenna) reaches the converter ${num(-converter.headroomDb, 3)} dB above its full scale of ${num(converter.fullScaleDbm, 3)} dBm: it clips. Reduce the gain ahead of it or add gain control.`, // prettier-ignore
      data: { headroomDb: converter.headroomDb, fullScaleDbm: converter.fullScaleDbm },
    });
  }
  return flags;
}
