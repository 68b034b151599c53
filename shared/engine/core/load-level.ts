/**
 * A load whose impedance depends on the level it gets (a diode detector) is settled with the
 * chain before the analysis: the chain ahead of it is a Thevenin source (Vth, Zth) at f0,
 * and the node voltage V must satisfy |V| = |Vth·Zl(|V|) / (Zth + Zl(|V|))|. The load is
 * then fixed at Zl(|V|) for the whole analysis (a linearisation at the working level).
 */
import type { BuiltChain } from './build';
import { runNodeAnalysis, sharedWorkspace } from './nodes';

/** The chain with its level-dependent load settled at f0 (the chain itself when there is none). */
export function settleLoadLevel(built: BuiltChain): BuiltChain {
  const atLevel = built.load.model.impedanceAtLevel;
  if (!atLevel) return built;
  const na = runNodeAnalysis(built, [built.settings.f0Hz], sharedWorkspace('point', built, 1));
  const k = built.sections.length * na.points;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  // Thevenin voltage: Vth = V·(Zth + Zl)/Zl.
  const z2 = zr * zr + zi * zi;
  const vth =
    Number.isFinite(sr) && Number.isFinite(si) && z2 > 0
      ? Math.hypot(na.vRe[k], na.vIm[k]) * (Math.hypot(sr + zr, si + zi) / Math.sqrt(z2))
      : 0;
  const z = new Float64Array(2);
  const f0 = built.f0AtFlatNode[built.sections.length];
  /** |V| the chain delivers into the load taken at level v, minus v (falls through 0). */
  const gap = (v: number) => {
    atLevel(v)(f0, z, 0);
    return (vth * Math.hypot(z[0], z[1])) / Math.hypot(sr + z[0], si + z[1]) - v;
  };
  let lo = 0;
  let hi = vth;
  if (vth > 0 && Number.isFinite(vth)) {
    for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
      const mid = 0.5 * (lo + hi);
      if (gap(mid) > 0) lo = mid;
      else hi = mid;
    }
  }
  const level = 0.5 * (lo + hi);
  return {
    ...built,
    load: { ...built.load, model: { ...built.load.model, impedance: atLevel(level) } },
  };
}
