/**
 * Every two-port stage type of the catalogue that SPICE can express, between a resistive
 * source and an R ∥ C load, at its default values and at one other in-range set: the
 * engine's sweep must match ngspice's AC analysis of the generated netlist within 0.01 dB
 * and 0.1° at every node and in the input impedance, over 301 log-spaced points.
 * Reference: ngspice (Debian package ngspice), run in the test.
 */
import { chainToSpice, SpiceExportError } from '../../shared/engine/spice/netlist';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { ParamSpec, ParamValues, StageDefinition } from '../../shared/engine/types';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { AGREEMENT, expectAgreement } from './helpers/compare';

const catalogue = STAGE_DEFINITIONS;
const twoPorts = catalogue.filter((d) => d.role === 'two-port');

/** 10 kHz … 1 GHz, 60 points per decade: 301 points on ngspice's own `dec` grid. */
const SWEEP = { startHz: 1e4, stopHz: 1e9, points: 301, scale: 'log' as const };

function chainAround(
  def: StageDefinition,
  values: ParamValues,
  around: { rs: number; rl: number; cl: number },
): ChainDocument {
  return parseChainDocument({
    name: `${def.type} between ${around.rs} Ω and ${around.rl} Ω ∥ ${around.cl} F`,
    settings: { f0Hz: 10e6, sweep: SWEEP },
    stages: [
      { id: 'src', type: 'resistive-generator', values: { r: around.rs, level: 'emf', emf: 1 } },
      { id: 'dut', type: def.type, values },
      { id: 'load', type: 'rc-load', values: { r: around.rl, c: around.cl } },
    ],
  });
}

/** Whether a parameter is shown (and so used) for these values. */
function shown(spec: ParamSpec, values: ParamValues): boolean {
  return !spec.showWhen || values[spec.showWhen.key] === spec.showWhen.equals;
}

/**
 * A second in-range parameter set: every number moved by ×1.37 (or ÷1.37 when that would
 * pass its maximum), enums and booleans kept, so the stage keeps its topology.
 */
function otherValues(def: StageDefinition): ParamValues {
  const values: ParamValues = Object.fromEntries(def.params.map((p) => [p.key, p.default]));
  for (const spec of def.params) {
    if (spec.kind !== 'number' || !shown(spec, values)) continue;
    const v = spec.default as number;
    if (v === 0) continue;
    let moved = v * 1.37;
    if (spec.max !== undefined && moved > spec.max) moved = v / 1.37;
    if (spec.min !== undefined && moved < spec.min) moved = v;
    values[spec.key] = moved;
  }
  return values;
}

/**
 * One enum option changed. A design-mode network would refuse orientations that do not suit
 * its default resistances, so topology variants use the stage's own component values.
 */
function variant(def: StageDefinition, key: string, value: string): ParamValues {
  const mode = def.params.find((p) => p.key === 'mode');
  const byValues = key !== 'mode' && mode?.options?.some((o) => o.value === 'values');
  return byValues ? { mode: 'values', [key]: value } : { [key]: value };
}

const defaultsOf = (def: StageDefinition): ParamValues =>
  Object.fromEntries(def.params.map((p) => [p.key, p.default]));

/** Whether the stage builds at its defaults (a measured stage may need a data file). */
function buildable(def: StageDefinition): boolean {
  try {
    def.build(defaultsOf(def), { f0Hz: 10e6, temperatureK: 290 });
    return true;
  } catch {
    return false;
  }
}

function expressible(def: StageDefinition): boolean {
  return (
    buildable(def) &&
    def.build(defaultsOf(def), { f0Hz: 10e6, temperatureK: 290 }).spice !== undefined
  );
}

describe('every SPICE-expressible stage type against ngspice', () => {
  it('should include the resistive source and the R ∥ C load these checks use', () => {
    expect(catalogue.map((d) => d.type)).toEqual(
      expect.arrayContaining(['resistive-generator', 'rc-load']),
    );
    expect(twoPorts.filter(expressible).length).toBeGreaterThan(0);
  });

  describe.each(twoPorts.filter(expressible).map((d) => [d.type, d] as const))(
    '%s',
    (_type, def) => {
      it('should agree at its default values (50 Ω source, 1 kΩ ∥ 10 pF load)', () => {
        const a = expectAgreement(
          chainAround(def, {}, { rs: 50, rl: 1000, cl: 10e-12 }),
          catalogue,
        );
        expect(a.points).toBe(301);
        expect(a.worstDb.dbError).toBeLessThanOrEqual(AGREEMENT.db);
        expect(a.worstDeg.degError).toBeLessThanOrEqual(AGREEMENT.deg);
      });

      it('should agree at another in-range set (300 Ω source, 4.7 kΩ ∥ 22 pF load)', () => {
        const doc = chainAround(def, otherValues(def), { rs: 300, rl: 4700, cl: 22e-12 });
        const a = expectAgreement(doc, catalogue);
        expect(a.worstDb.dbError).toBeLessThanOrEqual(AGREEMENT.db);
        expect(a.worstDeg.degError).toBeLessThanOrEqual(AGREEMENT.deg);
      });
    },
  );

  // Each other option of each enum (orientation, position, element...) changes the topology.
  const variants = twoPorts
    .filter(expressible)
    .flatMap((def) =>
      def.params
        .filter((p) => p.kind === 'enum')
        .flatMap((p) =>
          (p.options ?? [])
            .filter((o) => o.value !== p.default)
            .map(
              (o) =>
                [
                  `${def.type} with ${p.key} = ${o.value}`,
                  def,
                  variant(def, p.key, o.value),
                ] as const,
            ),
        ),
    );
  it.each(variants)('should agree for %s', (_name, def, values) => {
    const a = expectAgreement(
      chainAround(def, values, { rs: 75, rl: 2200, cl: 4.7e-12 }),
      catalogue,
    );
    expect(a.worstDb.dbError).toBeLessThanOrEqual(AGREEMENT.db);
    expect(a.worstDeg.degError).toBeLessThanOrEqual(AGREEMENT.deg);
  });

  it('should refuse every stage SPICE cannot express with an error naming the stage', () => {
    // The catalogue's own such types, plus a test-only one so the check always runs.
    const untranslatable: StageDefinition = {
      type: 'test-frequency-shifter',
      category: 'mixer',
      role: 'two-port',
      label: 'Test shifter',
      summary: 'A two-port with no SPICE form, defined by this test.',
      params: [],
      build: () => ({ sections: [{ abcd: (_f, out, o) => out.set([1, 0, 0, 0, 0, 0, 1, 0], o) }] }),
    };
    const refused = [...twoPorts.filter((d) => buildable(d) && !expressible(d)), untranslatable];
    for (const def of refused) {
      const doc = chainAround(def, {}, { rs: 50, rl: 1000, cl: 10e-12 });
      expect(() => chainToSpice(doc, { catalogue: [...catalogue, untranslatable] })).toThrow(
        SpiceExportError,
      );
      expect(() => chainToSpice(doc, { catalogue: [...catalogue, untranslatable] })).toThrow(
        /^Stage 2 ".*" \(.*\) cannot be written as a SPICE netlist/,
      );
    }
  });
});
