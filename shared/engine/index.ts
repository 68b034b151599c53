/**
 * Public API of the analysis engine (framework-free; called by the server, the CLI and the
 * benchmark; the client imports only its types). Import from here rather than from the
 * modules behind it.
 */
export {
  analyzeChain,
  analyzeBuilt,
  ENGINE_VERSION,
  type AnalyzeOptions,
  type SolveClock,
} from './analyze';
export {
  SWEEP_CHUNK,
  sweepChain,
  sweepChainInChunks,
  type SweepChunkOptions,
  type SweepOnlyOptions,
} from './sweep-only';
export {
  buildChain,
  stageName,
  type BuildOptions,
  type BuiltChain,
  type BuiltStage,
  type ChainBody,
  type ModeRef,
} from './core/build';
export { runNodeAnalysis, createNodeAnalysis, type NodeAnalysis } from './core/nodes';
export * as quantities from './core/quantities';
export {
  ABCD_SLOTS,
  abcdToS,
  abcdToY,
  abcdToZ,
  cascade,
  cascadeAll,
  db20,
  identityAbcd,
  phaseDeg,
  sToAbcd,
  sToAbcdAt,
  type RefImpedance,
} from './core/abcd';
export { cabs, carg, cdiv, cinv, cmul, csqrt, isOpen } from './core/complex';
export { frequencyGrid, logGrid, type SweepSpec } from './core/sweep';
export {
  BOLTZMANN,
  T0_KELVIN,
  cascadeNoiseFigure,
  emfForAvailableDbm,
  friis,
  noiseFloorDbm,
  sensitivityDbm,
  sfdrDb,
  stageNoiseFactor,
  thermalNoiseW,
} from './core/noise';
export { cascadeIip3, cascadeInputPoint, cascadeP1db } from './core/linearity';
export {
  cascadeNoiseParameters,
  correlationNoiseFigureDb,
  passiveCorrelation,
} from './core/noise-correlation';
export { analyzeResonators, searchRange } from './core/resonators';
export { analyzeSelectivity, findMixer, imageFrequency, type MixerInfo } from './core/selectivity';
export { raiseFlags, CAUTION_TEXT } from './core/flags';
export { formatQuantity, formatNumber } from './core/format';
export { validateChain } from './validate';
export {
  analyseModes,
  chainInMode,
  hasModes,
  insertStagesAfter,
  modeIds,
  modeValidationIssues,
  modeView,
  type ModeAnalysis,
} from './modes';
export * from './errors';
export * from './types';
export { catalogue, getStageDefinition } from './catalogue';
export { STAGE_DEFINITIONS } from './stages';
export {
  chainToSpice,
  chainToSpiceDeck,
  SpiceExportError,
  type ChainToSpiceOptions,
  type SpiceDeck,
} from './spice/netlist';
export { parseRusage, parseWrdata, type SpiceTimes } from './spice/output';
