/**
 * The bare cascade the full analysis is compared with: each section's ABCD over the sweep,
 * multiplied into a running product, and nothing else (no impedances, voltages, reports).
 * It evaluates the sections by their block forms (`Section.fill`, all eight slots of each
 * matrix), as the node analysis does for a general section, so the ratio measures what the
 * analysis adds to the cascade itself. (The node analysis takes a ladder's shunt and series
 * sections by their one part's block form and steps of their own, core/ladder-steps.ts; a
 * general 2×2 product has no use for that, so the cascade here keeps to the general form.)
 */
import { cascade, type BuiltChain } from '../../shared/engine';

export interface BareCascade {
  run(): void;
  /** The chain's overall ABCD, 8 slots per point. */
  product: Float64Array;
}

export function bareCascade(built: BuiltChain, freqs: Float64Array): BareCascade {
  const P = freqs.length;
  const product = new Float64Array(8 * P);
  const section = new Float64Array(8 * P);
  return {
    product,
    run() {
      const sections = built.sections;
      if (sections.length === 0) return;
      sections[0].fill(freqs, 0, P, product, 0);
      for (let j = 1; j < sections.length; j++) {
        sections[j].fill(freqs, 0, P, section, 0);
        for (let i = 0; i < P; i++) cascade(product, 8 * i, section, 8 * i, product, 8 * i);
      }
    },
  };
}
