/**
 * Turns a synthesised matching network into stage instances to insert into a chain: the
 * catalogue's matching stage (in its component-values mode) when the parts fit its
 * topology, otherwise one single-component stage per part.
 */
import type { StageInstance } from '../../schema/chain';
import type { LadderPart } from './complex-match';

/** Unloaded Q of the inserted parts. */
export interface PartsQ {
  ql: number;
  qc: number;
}

interface Design {
  topology: string;
  title: string;
  parts: LadderPart[];
  extra?: Record<string, number>;
}

const sig = (parts: LadderPart[]) => parts.map((p) => `${p.place}-${p.part}`).join(' ');

const L_ORIENTATIONS: Record<string, string> = {
  'series-L shunt-C': 'series-l-shunt-c',
  'shunt-C series-L': 'shunt-c-series-l',
  'series-C shunt-L': 'series-c-shunt-l',
  'shunt-L series-C': 'shunt-l-series-c',
};

function valuesOf(parts: LadderPart[], keys: string[]): Record<string, number> {
  return Object.fromEntries(keys.map((k, i) => [k, parts[i].value]));
}

/** The catalogue stage for these parts, or null when none has this topology. */
function matchingStage(d: Design, q: PartsQ): Pick<StageInstance, 'type' | 'values'> | null {
  const s = sig(d.parts);
  const common = { mode: 'values', ql: q.ql, qc: q.qc };
  if (d.topology === 'l-section' && L_ORIENTATIONS[s]) {
    const l = d.parts.find((p) => p.part === 'L')!.value;
    const c = d.parts.find((p) => p.part === 'C')!.value;
    return { type: 'l-match', values: { ...common, orientation: L_ORIENTATIONS[s], l, c } };
  }
  if (d.topology === 'pi' && s === 'shunt-C series-L shunt-C') {
    return { type: 'pi-match', values: { ...common, ...valuesOf(d.parts, ['c1', 'l', 'c2']) } };
  }
  if (d.topology === 't' && s === 'series-L shunt-C series-L') {
    return { type: 't-match', values: { ...common, ...valuesOf(d.parts, ['l1', 'c', 'l2']) } };
  }
  if (d.topology === 'tapped-c' && s === 'shunt-L series-C shunt-C') {
    return {
      type: 'tapped-c-match',
      values: { ...common, ...valuesOf(d.parts, ['l', 'c1', 'c2']) },
    };
  }
  if (d.topology === 'double-l' && s === 'series-L shunt-C series-L shunt-C') {
    return {
      type: 'double-l-match',
      values: { ...common, form: 'step-up', ...valuesOf(d.parts, ['l1', 'c1', 'l2', 'c2']) },
    };
  }
  if (d.topology === 'double-l' && s === 'shunt-C series-L shunt-C series-L') {
    return {
      type: 'double-l-match',
      values: { ...common, form: 'step-down', ...valuesOf(d.parts, ['c1', 'l1', 'c2', 'l2']) },
    };
  }
  return null;
}

/** One single-component stage for a part. */
export function partStage(p: LadderPart, q: PartsQ, id: string, label: string): StageInstance {
  const values: StageInstance['values'] =
    p.part === 'L'
      ? { position: p.place, element: 'inductor', l: p.value, ql: q.ql }
      : { position: p.place, element: 'capacitor', c: p.value, qc: q.qc };
  return { id, type: 'lumped-element', label, values };
}

/** The stage instances that realise a design, with fresh ids from `nextId`. */
export function ladderStages(d: Design, q: PartsQ, nextId: () => string): StageInstance[] {
  const whole = matchingStage(d, q);
  if (whole) return [{ id: nextId(), label: d.title.split(':')[0], ...whole }];
  if (d.topology === 'coupled-coils' && d.extra) {
    const out: StageInstance[] = [];
    const seriesPart = d.parts.find((p) => p.place === 'series');
    const shuntPart = d.parts.find((p) => p.place === 'shunt');
    if (seriesPart) out.push(partStage(seriesPart, q, nextId(), 'Match: primary series part'));
    out.push({
      id: nextId(),
      type: 'coupled-coils',
      label: 'Match: coupled coils',
      values: { l1: d.extra.l1, l2: d.extra.l2, k: d.extra.k, q1: q.ql, q2: q.ql },
    });
    if (shuntPart) out.push(partStage(shuntPart, q, nextId(), 'Match: secondary tuning'));
    return out;
  }
  return d.parts.map((p, i) =>
    partStage(p, q, nextId(), `Match part ${i + 1}: ${p.place} ${p.part === 'L' ? 'L' : 'C'}`),
  );
}
