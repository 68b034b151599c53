/**
 * The stage catalogue. A new stage type is one new definition added to STAGE_DEFINITIONS.
 *
 * SPICE forms: every type with a `spice` emitter is exact at each frequency of an ngspice
 * AC sweep (constant-Q losses are behavioural resistors of `hertz`). Types without one:
 * measured-antenna, measured-two-port, if-filter, mixer, and transmission-line with loss.
 */
import type { StageDefinition, StageTypeInfo } from '../types';
import { TRIODE_AMPLIFIER, UNILATERAL_AMPLIFIER } from './amplifiers';
import { COUPLED_BANDPASS } from './coupled-bandpass';
import { CAPACITIVE_TAP, COUPLED_COILS, IDEAL_TRANSFORMER, TAPPED_COIL } from './couplers';
import { ATTENUATOR_PAD, TR_SWITCH, TRANSMISSION_LINE } from './elements';
import { IF_FILTER } from './if-filter';
import { L_MATCH } from './l-match';
import { ADC_CONVERTER } from './converter';
import { EARPHONE_HIGH_Z, ENVELOPE_DETECTOR, HEADPHONE_LOW_Z, RC_LOAD } from './loads';
import { LUMPED_ELEMENT, SERIES_LC, SHUNT_LC_TANK } from './lumped';
import { DOUBLE_L_MATCH, PI_MATCH, T_MATCH, TAPPED_C_MATCH } from './matching-networks';
import { MEASURED_TWO_PORT } from './measured-two-port';
import { MIXER } from './mixer';
import { POWER_AMPLIFIER } from './power-amplifier';
import { RF_SWITCH } from './rf-switch';
import { SHUNT_BRANCH } from './shunt-branch';
import { withPlausibleRanges } from './plausibility';
import { MEASURED_ANTENNA, RESISTIVE_GENERATOR, SHORT_MONOPOLE } from './sources';

export { measuredTwoPort } from './measured-two-port';
export { parseTable, interpolate } from './measured-data';
export { gmForStatedGain, statedGainForGm } from './active-common';
export { mixerLoFrequency, mixerTranslate } from './mixer';
export { shortMonopole } from './sources';
export { padElements } from './elements';
export { snrOfEnob } from './converter';
export { paLoadLine } from './power-amplifier';
export { offCapacitanceForIsolation } from './rf-switch';
export { parseBranch, branchVectors } from './branch-parts';

export { withPlausibleRange } from './plausibility';

/**
 * Every stage type, in palette order, each parameter with its hard and typical range
 * (`plausibility.ts`). Types are unique (tested).
 */
export const STAGE_DEFINITIONS: StageDefinition[] = [
  RESISTIVE_GENERATOR,
  SHORT_MONOPOLE,
  MEASURED_ANTENNA,
  POWER_AMPLIFIER,
  IDEAL_TRANSFORMER,
  COUPLED_COILS,
  TAPPED_COIL,
  CAPACITIVE_TAP,
  L_MATCH,
  PI_MATCH,
  T_MATCH,
  DOUBLE_L_MATCH,
  TAPPED_C_MATCH,
  SERIES_LC,
  SHUNT_LC_TANK,
  COUPLED_BANDPASS,
  IF_FILTER,
  MEASURED_TWO_PORT,
  UNILATERAL_AMPLIFIER,
  TRIODE_AMPLIFIER,
  MIXER,
  ENVELOPE_DETECTOR,
  EARPHONE_HIGH_Z,
  HEADPHONE_LOW_Z,
  ADC_CONVERTER,
  RC_LOAD,
  LUMPED_ELEMENT,
  ATTENUATOR_PAD,
  TRANSMISSION_LINE,
  TR_SWITCH,
  RF_SWITCH,
  SHUNT_BRANCH,
].map(withPlausibleRanges);

/** The definition of a type, or undefined. */
export function findStageDefinition(type: string): StageDefinition | undefined {
  return STAGE_DEFINITIONS.find((d) => d.type === type);
}

/** The catalogue as sent to clients (no functions). */
export function stageTypeInfos(): StageTypeInfo[] {
  return STAGE_DEFINITIONS.map(({ build: _build, ...info }) => info);
}
