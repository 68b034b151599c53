/** Limits on studies, from the environment (defaults suit one small machine). */

const intFrom = (value: string | undefined, fallback: number) => {
  const n = Number(value);
  return value && Number.isFinite(n) && n > 0 ? n : fallback;
};

export interface StudyLimits {
  /** Largest work (trials or positions or evaluations × sweep points × stages) of one study. */
  maxWork: number;
  /** Studies one user may have queued or running at once. */
  maxActivePerUser: number;
  /** Seconds one run of a study may take before it fails. */
  budgetSeconds: number;
  /** Seconds without a heartbeat after which a running study's worker is taken for dead. */
  staleSeconds: number;
  /** Runs a study may start (the first and the resumes after a worker stopped). */
  maxAttempts: number;
}

export function studyLimitsFromEnv(env: NodeJS.ProcessEnv = process.env): StudyLimits {
  return {
    maxWork: intFrom(env.CW_STUDY_MAX_WORK, 40_000_000),
    maxActivePerUser: intFrom(env.CW_STUDY_MAX_ACTIVE, 3),
    budgetSeconds: intFrom(env.CW_STUDY_BUDGET_S, 600),
    staleSeconds: intFrom(env.CW_STUDY_STALE_S, 10),
    maxAttempts: intFrom(env.CW_STUDY_MAX_ATTEMPTS, 3),
  };
}
