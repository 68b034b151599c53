/**
 * What every matching stage shares: the values/design mode switch, the design inputs, the
 * component Q, and turning a design into the model's designedMatch and qBudget.
 */
import { designMatch, type MatchKind } from '../design';
import type { BuildContext, ParamSpec, ParamValues, TwoPortModel } from '../types';
import {
  designFrequency,
  enumParam,
  numParam,
  qParam,
  readParams,
  type ParamReader,
} from './common';
import { ladderSections, ladderSpice, type LadderElement } from './ladder';

const whenDesign = { key: 'mode', equals: 'design' };
/** Visible in values mode only. */
export const whenValues = { key: 'mode', equals: 'values' };

/** Mode switch and design inputs; `withQ` for topologies whose Q is a free choice. */
export function matchingParams(withQ: boolean, qDefault = 10): ParamSpec[] {
  const params: ParamSpec[] = [
    enumParam('mode', 'Entered as', [
      ['design', 'Design from resistances'],
      ['values', 'Component values'],
    ]),
    numParam('r1', 'Resistance at port 1', 'ohm', 50, {
      min: 0,
      exclusiveMin: true,
      showWhen: whenDesign,
      help: 'The resistance port 1 should present (the source side).',
    }),
    numParam('r2', 'Resistance on port 2', 'ohm', 1000, {
      min: 0,
      exclusiveMin: true,
      showWhen: whenDesign,
      help: 'The resistance that terminates port 2 (the load side).',
    }),
    numParam('f0', 'Design frequency', 'hertz', 0, {
      min: 0,
      showWhen: whenDesign,
      help: '0 uses the chain design frequency.',
    }),
  ];
  if (withQ) {
    params.push(
      numParam('q', 'Loaded Q', 'ratio', qDefault, {
        min: 0,
        exclusiveMin: true,
        showWhen: whenDesign,
        help: 'Higher Q narrows the band; it must exceed the minimum the resistances set.',
      }),
    );
  }
  params.push(
    numParam('parasiticC', 'Capacitance already across port 2', 'farad', 0, {
      min: 0,
      showWhen: whenDesign,
      help: 'E.g. a device input capacitance; the design absorbs it.',
    }),
    qParam('ql', 'Coil Q', 100),
    qParam('qc', 'Capacitor Q', 1000),
  );
  return params;
}

/** A values-mode component parameter. */
export function componentParam(
  key: string,
  label: string,
  unit: 'henry' | 'farad',
  def: number,
): ParamSpec {
  return numParam(key, label, unit, def, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    showWhen: whenValues,
  });
}

/**
 * Builds a matching stage: component values from the design (design mode) or the form
 * (values mode), then the ladder from `topology`.
 */
export function buildMatching(
  specs: ParamSpec[],
  values: ParamValues,
  ctx: BuildContext,
  kind: (p: ParamReader) => MatchKind,
  topology: (parts: Record<string, number>, p: ParamReader) => LadderElement[],
  componentKeys: string[],
  check?: (design: ReturnType<typeof designMatch>, p: ParamReader) => void,
): TwoPortModel {
  const p = readParams(specs, values);
  const componentQ = Math.min(p.num('ql'), p.num('qc'));
  let parts: Record<string, number>;
  const model: Partial<TwoPortModel> = {};
  if (p.str('mode') === 'design') {
    const design = designMatch(kind(p), {
      r1: p.num('r1'),
      r2: p.num('r2'),
      f0: designFrequency(p.num('f0'), ctx),
      q: specs.some((s) => s.key === 'q') ? p.num('q') : undefined,
      parasiticC: p.num('parasiticC'),
    });
    check?.(design, p);
    parts = design.values;
    model.designedMatch = { r1: p.num('r1'), r2: p.num('r2') };
    model.designedValues = Object.fromEntries(componentKeys.map((k) => [k, parts[k]]));
    model.qBudget = { required: design.q, componentQ };
  } else {
    parts = Object.fromEntries(componentKeys.map((k) => [k, p.num(k)]));
  }
  const elements = topology(parts, p);
  return {
    ...model,
    sections: ladderSections(elements),
    noise: { kind: 'passive' },
    spice: ladderSpice(elements),
  };
}
