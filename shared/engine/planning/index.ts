/** Receiver planning: spurious responses, strong signals, outside noise and the converter. */
export { planChain, type PlanContext, type PlanReport, type ExternalNoiseReport } from './plan';
export { planFlags } from './flags';
export * from './external-noise';
export * from './spur-frequencies';
export { spurResponses, spurChart, rankIfs, selectivityAhead, COMMON_IFS_HZ } from './spurs';
export type { SpurResponse, SpurChart, SpurChartLine, IfCandidate, SpurOptions } from './spurs';
export * from './strong-signals';
export { converterReport, type ConverterInput, type ConverterReport } from './converter';
