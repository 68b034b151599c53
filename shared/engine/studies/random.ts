/**
 * Repeatable random numbers for studies. Each trial gets a generator of its own, seeded from
 * the study's seed and the trial's index, so a run gives the same trials whether it runs in
 * one piece, in chunks, or resumes from a checkpoint.
 */

/** A uniform generator on [0, 1). */
export type Uniform = () => number;

/**
 * Mulberry32: a small 32-bit generator (Tommy Ettinger's, public domain), ample for a few
 * thousand draws per trial.
 */
export function mulberry32(seed: number): Uniform {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Mixes the study seed with a trial index into a 32-bit seed (a murmur3-style finaliser). */
export function trialSeed(seed: number, trial: number): number {
  let h = (seed ^ Math.imul(trial + 1, 0x9e3779b1)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/** A standard normal draw by the Box–Muller transform (two uniforms per draw). */
export function standardNormal(u: Uniform): number {
  const u1 = 1 - u(); // (0, 1]: log stays finite
  const u2 = u();
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/**
 * A deviation in units of the stated tolerance: uniform on [−1, 1], or normal with the
 * tolerance read as 3σ (σ = 1/3 in these units).
 */
export function drawDeviation(u: Uniform, distribution: 'uniform' | 'normal'): number {
  return distribution === 'uniform' ? 2 * u() - 1 : standardNormal(u) / 3;
}
