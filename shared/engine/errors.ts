/**
 * Errors the engine throws. Each names what to fix: the stage, the parameter, and why.
 * The API maps ChainValidationError to HTTP 422 with `issues` as details.
 */

export interface ChainIssue {
  /** Id of the stage at fault, when the fault is in a stage. */
  stageId?: string;
  /** Position of the stage in the chain (0 = source). */
  stageIndex?: number;
  /** Parameter key at fault, e.g. "l". */
  param?: string;
  /** JSON path in the chain document, e.g. ["stages", 2, "values", "l"]. */
  path: (string | number)[];
  message: string;
}

/** A stage's builder refuses a value the schema let through (e.g. Rhigh equal to Rlow). */
export class StageParameterError extends Error {
  constructor(
    readonly param: string | undefined,
    message: string,
  ) {
    super(message);
    this.name = 'StageParameterError';
  }
}

/** The chain cannot be analysed as written; every issue found is listed. */
export class ChainValidationError extends Error {
  constructor(readonly issues: ChainIssue[]) {
    super(
      issues.length === 1
        ? issues[0].message
        : `${issues.length} problems in the chain: ${issues.map((i) => i.message).join('; ')}`,
    );
    this.name = 'ChainValidationError';
  }
}
