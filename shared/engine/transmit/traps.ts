/**
 * Branches to ground judged as what they are meant to be: a block (a high impedance at f0,
 * e.g. the idle transmitter's output network while receiving) or a short (a low one), each
 * against the impedance it shunts — the path onward from its node (or back toward the
 * source when nothing follows). Never as a tank: a trap's own resonance is not a tuned
 * circuit of the signal path, so the resonances it makes at its node are not reported as
 * tanks either.
 */
import type { BuiltChain } from '../core/build';
import type { ResonatorFinding } from '../core/resonators';
import type { NodeAnalysis } from '../core/nodes';
import type { Flag } from '../types';

/** How a branch to ground measures up at f0. */
export interface TrapReport {
  stageId: string;
  label: string;
  intent: 'high' | 'low';
  fHz: number;
  /** The branch's impedance, ohm. */
  zBranch: { re: number; im: number };
  /** The impedance it shunts, ohm. */
  zShunted: { re: number; im: number };
  /** |Z branch| / |Z shunted|. */
  ratio: number;
  /** The ratio it must reach (at least, for a block; at most its inverse, for a short). */
  required: number;
  ok: boolean;
}

const fmt = (x: number) => (x >= 100 ? x.toFixed(0) : x >= 10 ? x.toFixed(1) : x.toPrecision(2));

/** Every branch's judgement at f0 (one point of `f0Na`). */
export function judgeTraps(built: BuiltChain, f0Na: NodeAnalysis): TrapReport[] {
  const out: TrapReport[] = [];
  const t = new Float64Array(2);
  for (const stage of built.twoPorts) {
    const trap = stage.model.trap;
    if (!trap) continue;
    const j = stage.firstSection;
    const f = built.f0AtFlatNode[j];
    trap.impedance(f, t, 0);
    const zb = { re: t[0], im: t[1] };
    const onward = (j + stage.sectionCount) * f0Na.points;
    const back = j * f0Na.points;
    const openOnward = !Number.isFinite(f0Na.zinRe[onward]) || !Number.isFinite(f0Na.zinIm[onward]); // prettier-ignore
    const zs = openOnward
      ? { re: f0Na.zsrcRe[back], im: f0Na.zsrcIm[back] }
      : { re: f0Na.zinRe[onward], im: f0Na.zinIm[onward] };
    const magB = Number.isFinite(zb.re) ? Math.hypot(zb.re, zb.im) : Infinity;
    const ratio = magB / Math.hypot(zs.re, zs.im);
    const ok = trap.intent === 'high' ? ratio >= trap.ratio : ratio <= 1 / trap.ratio;
    out.push({ stageId: stage.id, label: stage.label, intent: trap.intent, fHz: f, zBranch: zb, zShunted: zs, ratio, required: trap.ratio, ok }); // prettier-ignore
  }
  return out;
}

/** A flag for each branch that does not do what it is meant to. */
export function trapFlags(traps: readonly TrapReport[]): Flag[] {
  return traps
    .filter((r) => !r.ok)
    .map((r) => ({
      code: 'trap-missed' as const,
      severity: 'warning' as const,
      stageId: r.stageId,
      message:
        r.intent === 'high'
          ? `Branch "${r.label}" should block at f0 but presents only ${fmt(r.ratio)}× the impedance it shunts (|Z| ${fmt(Math.hypot(r.zBranch.re, r.zBranch.im))} Ω against ${fmt(Math.hypot(r.zShunted.re, r.zShunted.im))} Ω; at least ${r.required}× wanted): retune it to resonate at f0 or raise its Q.`
          : `Branch "${r.label}" should short f0 but presents ${fmt(r.ratio)}× the impedance it shunts (at most 1/${r.required} wanted): retune it to resonate at f0 or lower its loss.`,
      data: { ratio: r.ratio, required: r.required, intent: r.intent },
    }));
}

/**
 * Resonances the network shows that a branch to ground makes (it is part of their tuned
 * circuit and no other stage is): they belong to the trap's judgement, not to the tanks.
 */
export function isTrapResonance(built: BuiltChain, r: ResonatorFinding): boolean {
  if (r.origin !== 'found' || !r.partOf || r.partOf.length === 0) return false;
  const traps = new Set(built.twoPorts.filter((s) => s.model.trap).map((s) => s.id));
  return r.partOf.some((id) => traps.has(id)) && r.partOf.every((id) => traps.has(id) || !isTuned(built, id)); // prettier-ignore
}

/** Whether a stage has a resonator of its own (a tank, a series resonator). */
function isTuned(built: BuiltChain, id: string): boolean {
  const s = built.twoPorts.find((t) => t.id === id);
  return !!s && (s.model.resonators?.length ?? 0) > 0;
}
