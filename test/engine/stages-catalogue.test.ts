/**
 * Properties every catalogue entry must have: a consistent schema, defaults that build,
 * finite ABCD over 10 Hz – 3 GHz, AD − BC = 1 for reciprocal passive types over random
 * in-range values, and prefixed SPICE lines for every type SPICE can express.
 */
import fc from 'fast-check';
import { StageParameterError } from '../../shared/engine/errors';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import type { ParamSpec, ParamValues, StageDefinition } from '../../shared/engine/types';
import { abs, build, det, impedanceAt, stageAbcd, type AnyModel } from './stages-support';

const NO_SPICE = new Set(['measured-antenna', 'measured-two-port', 'if-filter', 'mixer']);
const FREQS = Array.from({ length: 61 }, (_, i) => 10 * 10 ** ((i / 60) * Math.log10(3e8)));
const F0S = [1e6, 10e6, 100e6];

describe('the catalogue schema', () => {
  it('has unique kebab-case types', () => {
    const types = STAGE_DEFINITIONS.map((d) => d.type);
    expect(new Set(types).size).toBe(types.length);
    for (const t of types) expect(t).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
    expect(types.length).toBeGreaterThanOrEqual(29);
  });

  it('no choice starts with the word its label ends with (a card writes "label choice")', () => {
    const repeats: string[] = [];
    for (const d of STAGE_DEFINITIONS) {
      for (const p of d.params) {
        const last = p.label.split(/\s+/).pop()!.toLowerCase();
        for (const o of p.options ?? []) {
          if (o.label.split(/\s+/)[0].toLowerCase() === last) {
            repeats.push(`${d.type}.${p.key}: "${p.label} ${o.label}"`);
          }
        }
      }
    }
    expect(repeats).toEqual([]);
  });

  it.each(STAGE_DEFINITIONS.map((d) => [d.type, d] as const))(
    '%s: params are consistent',
    (_t, d) => {
      const keys = d.params.map((p) => p.key);
      expect(new Set(keys).size).toBe(keys.length);
      expect(d.summary).toMatch(/\.$/);
      if (d.category === 'source') expect(d.role).toBe('source');
      if (d.role === 'load') expect(d.category).toBe('load');
      for (const p of d.params) {
        if (p.kind === 'number') {
          expect(typeof p.default).toBe('number');
          const v = p.default as number;
          if (p.min !== undefined) expect(p.exclusiveMin ? v > p.min : v >= p.min).toBe(true);
          if (p.max !== undefined) expect(v).toBeLessThanOrEqual(p.max);
        }
        if (p.kind === 'enum') {
          expect(p.options?.map((o) => o.value)).toContain(p.default);
        }
        if (p.showWhen) {
          const ctl = d.params.find((q) => q.key === p.showWhen?.key);
          expect(ctl).toBeDefined();
          if (ctl?.kind === 'enum')
            expect(ctl.options?.map((o) => o.value)).toContain(p.showWhen.equals);
        }
      }
      for (const preset of d.presets ?? []) {
        for (const k of Object.keys(preset.values)) expect(keys).toContain(k);
      }
    },
  );

  it('marks the stages that need a caution', () => {
    const cautions = (t: string) => STAGE_DEFINITIONS.find((d) => d.type === t)?.cautions ?? [];
    expect(cautions('triode-amplifier')).toContain('high-voltage');
    expect(cautions('tr-switch')).toContain('transmit');
  });
});

function defaults(d: StageDefinition): ParamValues {
  return Object.fromEntries(d.params.map((p) => [p.key, p.default]));
}

function expectFiniteModel(d: StageDefinition, m: AnyModel): void {
  if (d.role === 'two-port') {
    expect(m.sections.length).toBeGreaterThan(0);
    for (const f of FREQS) {
      const a = stageAbcd(m, f);
      for (const v of [a.a, a.b, a.c, a.d]) {
        expect(Number.isFinite(v.re) && Number.isFinite(v.im)).toBe(true);
      }
    }
  } else {
    expect(m.sections).toHaveLength(0);
    for (const f of FREQS) {
      const z = impedanceAt(m, f);
      expect(Number.isFinite(z.re) && Number.isFinite(z.im)).toBe(true);
      expect(z.re).toBeGreaterThanOrEqual(0);
    }
    if (d.role === 'source') expect(Number.isFinite(m.emf?.(1e6))).toBe(true);
  }
}

describe('defaults', () => {
  it.each(STAGE_DEFINITIONS.map((d) => [d.type, d] as const))(
    '%s builds at 1, 10 and 100 MHz with a finite model over 10 Hz – 3 GHz',
    (_t, d) => {
      for (const f0 of F0S) expectFiniteModel(d, build(d, defaults(d), f0));
    },
  );

  it.each(
    STAGE_DEFINITIONS.flatMap((d) =>
      (d.presets ?? []).map((p) => [`${d.type}/${p.key}`, d, p.values] as const),
    ),
  )('preset %s builds', (_t, d, values) =>
    expectFiniteModel(d, build(d, { ...defaults(d), ...values }, 10e6)),
  );
});

/** A random in-range value for one spec (log-uniform around the default for positive ones). */
function arbitraryValue(p: ParamSpec): fc.Arbitrary<number | string | boolean> {
  if (p.kind === 'enum') return fc.constantFrom(...(p.options ?? []).map((o) => o.value));
  if (p.kind === 'boolean') return fc.boolean();
  if (p.kind === 'text') return fc.constant(p.default);
  const def = p.default as number;
  const lo = p.min ?? -Infinity;
  const hi = p.max ?? Infinity;
  const whole = Number.isInteger(def) && p.unit === 'none';
  const arb =
    def > 0
      ? fc.double({ min: -1, max: 1, noNaN: true }).map((u) => def * 10 ** u)
      : Number.isFinite(lo) && Number.isFinite(hi)
        ? fc.double({ min: lo, max: hi, noNaN: true })
        : fc.constant(def);
  return arb.map((v) => {
    let x = Math.min(hi, Math.max(lo, whole ? Math.round(v) : v));
    if (p.exclusiveMin && x <= lo) x = def;
    return x;
  });
}

function arbitraryValues(d: StageDefinition): fc.Arbitrary<ParamValues> {
  return fc.record(Object.fromEntries(d.params.map((p) => [p.key, arbitraryValue(p)])));
}

const reciprocal = STAGE_DEFINITIONS.filter(
  (d) =>
    d.role === 'two-port' &&
    d.type !== 'measured-two-port' &&
    build(d, defaults(d), 10e6).noise?.kind === 'passive',
);

describe('reciprocity of passive two-ports (fast-check)', () => {
  it('covers the passive types', () => {
    expect(reciprocal.map((d) => d.type)).toEqual(
      expect.arrayContaining([
        'l-match',
        'coupled-coils',
        'tapped-coil',
        'transmission-line',
        'if-filter',
        'coupled-bandpass',
      ]),
    );
  });

  it.each(reciprocal.map((d) => [d.type, d] as const))(
    '%s: AD − BC = 1 at random values and frequencies',
    (_t, d) => {
      let built = 0;
      fc.assert(
        fc.property(
          arbitraryValues(d),
          fc.double({ min: 1, max: Math.log10(3e9), noNaN: true }),
          (values, lf) => {
            let m: AnyModel;
            try {
              m = build(d, values, 10e6);
            } catch (e) {
              // A refusal that names the parameter is a correct answer to an impossible design.
              expect(e).toBeInstanceOf(StageParameterError);
              return;
            }
            built += 1;
            const a = stageAbcd(m, 10 ** lf);
            const dd = det(a);
            const scale = 1 + abs(a.a) * abs(a.d) + abs(a.b) * abs(a.c);
            expect(Math.abs(dd.re - 1)).toBeLessThan(1e-9 * scale);
            expect(Math.abs(dd.im)).toBeLessThan(1e-9 * scale);
          },
        ),
        { numRuns: 150, seed: 20261201 },
      );
      expect(built).toBeGreaterThan(40);
    },
  );
});

/** Checks one ngspice line's names; returns the nodes it uses. */
function namesIn(line: string, prefix: string): string[] {
  const tok = line.split(/\s+/);
  const letter = tok[0][0];
  expect(tok[0].slice(1).startsWith(prefix)).toBe(true);
  switch (letter) {
    case 'K':
      expect(tok[1].slice(1).startsWith(prefix) && tok[2].slice(1).startsWith(prefix)).toBe(true);
      return [];
    case 'F':
      expect(tok[3].slice(1).startsWith(prefix)).toBe(true);
      return tok.slice(1, 3);
    case 'E':
    case 'G':
    case 'T':
      return tok.slice(1, 5);
    default:
      return tok.slice(1, 3);
  }
}

describe('SPICE emitters', () => {
  const expressible = STAGE_DEFINITIONS.filter((d) => !NO_SPICE.has(d.type));

  it('exist exactly for the types SPICE can express', () => {
    for (const d of STAGE_DEFINITIONS) {
      expect([d.type, typeof build(d, defaults(d), 10e6).spice]).toEqual([
        d.type,
        NO_SPICE.has(d.type) ? 'undefined' : 'function',
      ]);
    }
  });

  it.each(expressible.map((d) => [d.type, d] as const))(
    '%s: element names and internal nodes carry the prefix',
    (_t, d) => {
      const m = build(d, defaults(d), 10e6);
      const prefix = 's7';
      const lines = m.spice?.('n3', 'n4', prefix) ?? [];
      expect(lines.length).toBeGreaterThan(0);
      const nodes = new Set<string>();
      for (const line of lines) for (const n of namesIn(line, prefix)) nodes.add(n);
      for (const n of nodes) {
        expect(['n3', 'n4', '0'].includes(n) || n.startsWith(`${prefix}_n`)).toBe(true);
      }
      if (d.role === 'source') expect(lines.some((l) => l.startsWith(`V${prefix} `))).toBe(true);
      if (d.role === 'load') expect(nodes.has('n4')).toBe(false);
      if (d.role === 'two-port') expect(nodes.has('n3') && nodes.has('n4')).toBe(true);
    },
  );
});
