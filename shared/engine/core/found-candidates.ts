/**
 * The parallel resonances found at nodes, gathered as they are located, with the twins merged:
 * behind a frequency change, signal and image reach one node's tuned circuit at the same
 * frequency, and the view whose input frequency is nearer f0 is kept (when its tuned circuit
 * by itself counts as one).
 *
 * Measuring a candidate (its detached search above all) is most of what a found resonance
 * costs, and many are views of a resonator a stage declares, which the merge drops anyway (a
 * declared tank's node shows its resonance again to the search over nodes). Such a candidate
 * is kept unmeasured: only a later twin needs to know whether it counts, and it is measured
 * then. Measurement is a function of the node and the resonance alone, so what is kept is
 * what measuring every candidate as it came kept, in the same order.
 */
import type { NodeResonance } from './resonance-search';
import type { Claim } from './resonator-context';

const { abs, log } = Math;

/** A resonance found at a node; `fig` null until measured (only for one already covered). */
export interface Candidate<F> {
  node: number;
  res: NodeResonance;
  claim: Claim;
  fig: F | null;
}

/** Gathers candidates one located resonance at a time; `candidates` holds them in order. */
export interface CandidateGathering<F> {
  candidates: Candidate<F>[];
  offer(node: number, res: NodeResonance, claim: Claim): void;
}

/**
 * @param f0 the design frequency (input Hz): of two twins, the one nearer it is kept
 * @param measure a resonance's figures, or null when its tuned circuit by itself does not
 *   count (detached Q below MIN_DETACHED_Q): such a candidate is not kept
 * @param covered whether a resonator reported before the search covers a claim: such a
 *   candidate can never be reported, and is measured only when a twin needs it
 */
export function gatherCandidates<F>(
  f0: number,
  measure: (node: number, res: NodeResonance) => F | null,
  covered: (claim: Claim) => boolean,
): CandidateGathering<F> {
  const candidates: Candidate<F>[] = [];
  /** The first kept candidate at `node` at the frequency of `res` that counts. */
  const twinOf = (node: number, res: NodeResonance): Candidate<F> | undefined => {
    for (let i = 0; i < candidates.length; i++) {
      const c = candidates[i];
      if (c.node !== node || !(abs(c.res.fr / res.fr - 1) < 1e-6)) continue;
      if (c.fig === null) {
        // A deferred candidate: whether it counts decides what happens to its twin.
        const fig = measure(c.node, c.res);
        if (fig === null) {
          candidates.splice(i--, 1);
          continue;
        }
        c.fig = fig;
      }
      return c;
    }
    return undefined;
  };
  return {
    candidates,
    offer(node, res, claim) {
      const twin = twinOf(node, res);
      if (twin && abs(log(res.fIn / f0)) >= abs(log(twin.res.fIn / f0))) return;
      if (!twin && covered(claim)) {
        candidates.push({ node, res, claim, fig: null });
        return;
      }
      const fig = measure(node, res);
      if (fig === null) return;
      if (twin) Object.assign(twin, { res, fig, claim });
      else candidates.push({ node, res, claim, fig });
    },
  };
}
