/**
 * How much work a study asks for, in chain-point evaluations (trials or positions or
 * evaluations × sweep points × stages), so the server can refuse a job that is too big
 * before queuing it.
 */
import type { ChainDocument } from '../../schema/chain';
import type { StudySpec } from '../../schema/studies';

export interface WorkEstimate {
  /** The product the cap applies to. */
  units: number;
  /** How the product is made, in words, for the refusal message. */
  formula: string;
}

/** The work of a study on a chain. */
export function estimateWork(doc: ChainDocument, spec: StudySpec): WorkEstimate {
  const stages = doc.stages.length;
  switch (spec.kind) {
    case 'monte-carlo': {
      const points = spec.points ?? doc.settings.sweep.points;
      return {
        units: spec.trials * points * stages,
        formula: `trials (${spec.trials}) × sweep points (${points}) × stages (${stages})`,
      };
    }
    case 'band':
      // Without an oscillator the dial is found by a first analysis: two per position.
      return {
        units: spec.positions * (spec.oscillator ? 1 : 2) * spec.points * stages,
        formula: `dial positions (${spec.positions}) × analyses per position (${spec.oscillator ? 1 : 2}) × sweep points (${spec.points}) × stages (${stages})`,
      };
    case 'optimiser': {
      const points = spec.points ?? doc.settings.sweep.points;
      const evals = spec.maxIterations * (spec.variables.length + 1);
      return {
        units: evals * points * stages,
        formula: `evaluations (${spec.maxIterations} iterations × ${spec.variables.length + 1}) × sweep points (${points}) × stages (${stages})`,
      };
    }
  }
}
