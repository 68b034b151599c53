/**
 * Study engines (framework-free): Monte Carlo yield, tuning across a band, the optimiser,
 * and the work estimate the server caps jobs by. Pure functions over the engine's public API.
 */
export * from './chain-values';
export * from './metrics';
export * from './monte-carlo';
export * from './yield';
export * from './band';
export * from './optimiser';
export * from './statistics';
export * from './random';
export * from './work';
export * from './trial';
