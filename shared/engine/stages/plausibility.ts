/**
 * Plausibility ranges of stage parameters. Every numeric parameter gets a hard range (a
 * value outside it cannot be analysed: the chain is refused, naming stage, parameter and
 * range) and, where the trade has one, a typical range (a value outside it is analysed but
 * warned about: on the field in the editor and as an `implausible-value` flag). A
 * definition's own `min`, `max` and `typical` win; the unit's defaults below fill the rest.
 *
 * The typical ranges are common practice for receiver front ends from VLF to microwave,
 * deliberately wide: they catch unit-prefix slips (a "2.2k" capacitor is 2.2 kF, not
 * 2.2 nF) rather than unusual designs.
 *
 * A parameter that must be above 0 gets a positive floor instead: "above 0" lets through
 * 5e-324 Ω, which is no resistor and makes powers and impedances underflow to 0 and their
 * decibels to −∞. The floors (our rule) sit below the typical lower bound of each unit (a
 * tenth of a femtofarad, a femtohenry, a microohm), below any part a designer builds with,
 * and high enough that the products and quotients the analysis forms stay well inside
 * double precision.
 */
import type { ParamSpec, StageDefinition, UnitKind } from '../types';

interface UnitRange {
  /** Hard bounds for a parameter that gives none itself. */
  hardMin: number;
  hardMax: number;
  /** Typical bounds; the lower one applies only to parameters that must be above 0. */
  typicalMin?: number;
  typicalMax?: number;
  /** Smallest value of a parameter that must be above 0 (it replaces "above 0"). */
  floor?: number;
}

const UNIT_RANGES: Partial<Record<UnitKind, UnitRange>> = {
  ohm: { hardMin: -1e12, hardMax: 1e12, typicalMin: 1e-3, typicalMax: 1e8, floor: 1e-6 },
  henry: { hardMin: 0, hardMax: 1e3, typicalMin: 1e-10, typicalMax: 10, floor: 1e-15 },
  farad: { hardMin: 0, hardMax: 1e4, typicalMin: 1e-15, typicalMax: 1e-2, floor: 1e-16 },
  hertz: { hardMin: 0, hardMax: 1e12, typicalMin: 1, typicalMax: 3e11, floor: 1e-3 },
  volt: { hardMin: 0, hardMax: 1e6, typicalMax: 1e3, floor: 1e-15 },
  ampere: { hardMin: 0, hardMax: 1e3, typicalMin: 1e-18, typicalMax: 1, floor: 1e-21 },
  'volt-per-metre': { hardMin: 0, hardMax: 1e6, typicalMax: 1e3, floor: 1e-15 },
  metre: { hardMin: 0, hardMax: 1e6, typicalMin: 1e-5, typicalMax: 1e4, floor: 1e-9 },
  siemens: { hardMin: 0, hardMax: 1e3, typicalMin: 1e-6, typicalMax: 100, floor: 1e-12 },
  ratio: { hardMin: 0, hardMax: 1e12, floor: 1e-6 },
  db: { hardMin: -300, hardMax: 300, floor: 1e-6 },
  dbm: { hardMin: -300, hardMax: 100 },
  kelvin: { hardMin: 0, hardMax: 1e6, typicalMax: 1e4, floor: 1e-3 },
  degree: { hardMin: -360, hardMax: 360 },
  percent: { hardMin: 0, hardMax: 100, floor: 1e-6 },
  none: { hardMin: -1e12, hardMax: 1e12, floor: 1e-12 },
};

/** A numeric spec with its hard range and typical range filled from its unit. */
export function withPlausibleRange(spec: ParamSpec): ParamSpec {
  if (spec.kind !== 'number') return spec;
  const u = UNIT_RANGES[spec.unit];
  if (!u) return spec;
  const min = spec.min ?? u.hardMin;
  const max = spec.max ?? u.hardMax;
  const strictlyPositive = min === 0 && spec.exclusiveMin === true;
  const typical = spec.typical ?? {
    ...(strictlyPositive && u.typicalMin !== undefined ? { min: u.typicalMin } : {}),
    ...(u.typicalMax !== undefined && u.typicalMax < max ? { max: u.typicalMax } : {}),
  };
  const hasTypical = typical.min !== undefined || typical.max !== undefined;
  const floored = strictlyPositive && u.floor !== undefined && u.floor < max;
  return {
    ...spec,
    min: floored ? u.floor : min,
    max,
    ...(floored ? { exclusiveMin: false } : {}),
    ...(hasTypical ? { typical } : {}),
  };
}

/** The definition with every numeric parameter given its ranges. */
export function withPlausibleRanges(def: StageDefinition): StageDefinition {
  return { ...def, params: def.params.map(withPlausibleRange) };
}
