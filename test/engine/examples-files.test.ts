/**
 * Every example chain in `examples/`: a valid chain document, stage types and parameter keys
 * exactly as in the stage catalogue, values the engine actually reads, `variantOf` links the
 * demo seed can follow, and an analysis that runs over the whole sweep with finite results.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain, catalogue, friis, type StageTypeInfo } from '../../shared/engine';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { parseQuantity } from '../../shared/units';

const DIR = path.join(__dirname, '..', '..', 'examples');
const SUFFIX = '.chain.json';
/** The seed's rule for an example key (server/chains/examples.ts). */
const KEY = /^[a-z0-9][a-z0-9-]{0,79}$/;
const TOP_LEVEL = [
  'format',
  'formatVersion',
  'name',
  'description',
  'settings',
  'stages',
  'modes',
  'variantOf',
];

const keys = readdirSync(DIR)
  .filter((n) => n.endsWith(SUFFIX))
  .map((n) => n.slice(0, -SUFFIX.length))
  .sort();
const rawOf = (key: string) => readFileSync(path.join(DIR, key + SUFFIX), 'utf8');
const jsonOf = (key: string) => JSON.parse(rawOf(key)) as Record<string, unknown>;
const docOf = (key: string) => {
  const { variantOf: _variant, ...doc } = jsonOf(key);
  return chainDocumentSchema.parse(doc);
};
const types = new Map<string, StageTypeInfo>(catalogue().map((t) => [t.type, t]));

/** The same visibility rule the engine applies: a hidden value is reset to its default. */
function visible(spec: StageTypeInfo['params'][number], values: Record<string, unknown>) {
  return !spec.showWhen || values[spec.showWhen.key] === spec.showWhen.equals;
}

describe('the example set', () => {
  it('holds the receiver scenarios the demo workspace is built around', () => {
    expect(keys.length).toBeGreaterThanOrEqual(7);
    for (const key of [
      'longwave-time-signal-loop',
      'longwave-time-signal-loop-light-load',
      'shortwave-superhet-single-tank',
      'shortwave-superhet-coupled-pair',
      'two-metre-coupled-preselector',
      'sensor-868-front-end',
      'marine-vhf-sdr',
    ]) {
      expect(keys).toContain(key);
    }
  });

  it('gives every chain its own name (the seed finds chains by name)', () => {
    const names = keys.map((k) => docOf(k).name);
    expect(new Set(names).size).toBe(names.length);
  });

  it('uses matching networks in design mode in at least two chains', () => {
    const designed = keys.filter((k) =>
      docOf(k).stages.some(
        (s) => types.get(s.type)?.category === 'matching' && s.values.mode === 'design',
      ),
    );
    expect(designed.length).toBeGreaterThanOrEqual(2);
  });

  it('states tolerances on values in at least three chains', () => {
    expect(
      keys.filter((k) => docOf(k).stages.some((s) => s.tolerances)).length,
    ).toBeGreaterThanOrEqual(3);
  });
});

/** The flags each scenario is about (cautions apart); every other example raises none. */
const EXPECTED_FLAGS: Record<string, string[]> = {
  'longwave-time-signal-loop': ['detector-underdriven', 'tank-overloaded'],
  'longwave-time-signal-loop-light-load': ['detector-underdriven'],
  'sensor-868-front-end': ['match-missed', 'noise-mismatch'],
  // The grid sees its tuned input off the source its 4 dB figure holds for (VSWR about 6).
  'am-broadcast-triode-trf': ['noise-mismatch'],
  'shortwave-superhet-coupled-pair': ['q-budget'],
  // Unmatched on purpose (the match is the study): the 1 kΩ preamplifier sees 10 Ω − j2.35 kΩ.
  'short-whip-1mhz-match-study': ['noise-mismatch'],
};

describe.each(keys)('example %s', (key) => {
  const raw = jsonOf(key);
  const doc = docOf(key);

  it('has a key the seed accepts and only the known top-level fields', () => {
    expect(key).toMatch(KEY);
    for (const field of Object.keys(raw)) expect(TOP_LEVEL).toContain(field);
    expect(raw.format).toBe('chainwright-chain');
    expect(raw.formatVersion).toBe(1);
  });

  it('is a valid chain document', () => {
    const { variantOf: _variant, ...rest } = raw;
    const parsed = chainDocumentSchema.safeParse(rest);
    expect(parsed.error?.issues ?? []).toEqual([]);
  });

  it('names an existing, non-variant parent when it is a variant', () => {
    if (raw.variantOf === undefined) return;
    expect(typeof raw.variantOf).toBe('string');
    const parent = raw.variantOf as string;
    expect(parent).not.toBe(key);
    expect(keys).toContain(parent);
    // The seed links parents before variants, so a parent must not itself be a variant.
    expect(jsonOf(parent).variantOf).toBeUndefined();
  });

  it('uses catalogue types, unique ids, and parameter keys the engine reads', () => {
    const ids = doc.stages.map((s) => s.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const stage of doc.stages) {
      const info = types.get(stage.type);
      expect(info).toBeDefined();
      const specs = new Map(info!.params.map((p) => [p.key, p]));
      for (const [k, v] of Object.entries(stage.values)) {
        const spec = specs.get(k);
        expect({ stage: stage.id, key: k, known: spec !== undefined }).toEqual({ stage: stage.id, key: k, known: true }); // prettier-ignore
        // A value hidden by its showWhen is silently replaced by the default.
        expect({ stage: stage.id, key: k, visible: visible(spec!, { ...defaults(info!), ...stage.values }) }).toEqual({ stage: stage.id, key: k, visible: true }); // prettier-ignore
        if (spec!.kind === 'enum') expect(spec!.options!.map((o) => o.value)).toContain(v);
        if (spec!.kind === 'number') {
          expect(typeof v).toBe('number');
          if (spec!.min !== undefined) expect(v as number).toBeGreaterThanOrEqual(spec!.min);
          if (spec!.max !== undefined) expect(v as number).toBeLessThanOrEqual(spec!.max);
        }
      }
      for (const k of Object.keys(stage.tolerances ?? {})) {
        expect({ stage: stage.id, key: k, tolerance: specs.get(k)?.tolerance === true }).toEqual({ stage: stage.id, key: k, tolerance: true }); // prettier-ignore
      }
    }
  });

  it('shows, in `entered`, text that parses back to the stored value (±0.1 %)', () => {
    for (const stage of doc.stages) {
      const info = types.get(stage.type)!;
      for (const [k, text] of Object.entries(stage.entered ?? {})) {
        const spec = info.params.find((p) => p.key === k);
        expect(spec).toBeDefined();
        const parsed = parseQuantity(text, spec!.unit);
        expect(parsed).toMatchObject({ ok: true });
        const value = stage.values[k] as number;
        if (parsed.ok) expect(Math.abs(parsed.value / value - 1)).toBeLessThanOrEqual(1e-3);
      }
    }
  });

  it('explains the scenario and what to look at, with no machine paths', () => {
    expect(doc.description.length).toBeGreaterThan(200);
    expect(doc.description).toMatch(/What to look at/);
    expect(rawOf(key)).not.toMatch(/\/work\/|\/home\/|\/tmp\/|[A-Z]:\\/);
    for (const s of doc.stages) expect(s.label.length).toBeGreaterThan(3);
  });

  it('sweeps across its design frequency (and its image, with a mixer)', () => {
    const { f0Hz, sweep } = doc.settings;
    expect(sweep.startHz).toBeLessThan(f0Hz);
    expect(sweep.stopHz).toBeGreaterThan(f0Hz);
    expect(sweep.points).toBeGreaterThanOrEqual(801);
    const image = analyzeChain(doc, { sweep: false }).selectivity[0].imageHz;
    if (image !== null) {
      expect(image).toBeGreaterThan(sweep.startHz);
      expect(image).toBeLessThan(sweep.stopHz);
    }
  });

  it('analyses with finite results at every node over the whole sweep', () => {
    const res = analyzeChain(doc, { sweep: true });
    expect(res.sweep!.freqsHz).toHaveLength(doc.settings.sweep.points);
    for (const node of res.sweep!.nodes) {
      expect(node.stepUpDb.filter((v) => !Number.isFinite(v))).toEqual([]);
    }
    for (const n of res.nodes) expect(Number.isFinite(n.vPeak)).toBe(true);
    expect(Number.isFinite(res.levels.noiseFigureDb)).toBe(true);
    expect(res.flags.filter((f) => f.code === 'no-resonance' || f.code === 'tank-detuned')).toEqual(
      [],
    );
  });

  it('raises exactly the flags its scenario is about', () => {
    const res = analyzeChain(doc, { sweep: false });
    const codes = [...new Set(res.flags.filter((f) => f.code !== 'caution').map((f) => f.code))];
    expect(codes.sort()).toEqual(EXPECTED_FLAGS[key] ?? []);
  });

  it('cascades its noise by Friis from the stage figures it reports (self-consistency)', () => {
    // Friis: F = F1 + (F2 − 1)/G1 + … with each stage's available gain (ENGINE.md, Noise).
    const res = analyzeChain(doc, { sweep: false });
    const lin = (db: number) => 10 ** (db / 10);
    const f = friis(res.stages.map((s) => lin(s.availableGainDb)), res.stages.map((s) => lin(s.noiseFigureDb))); // prettier-ignore
    expect(10 * Math.log10(f[f.length - 1])).toBeCloseTo(res.levels.noiseFigureDb, 9);
  });

  it('carries the usual caution in its description wherever a stage is hazardous', () => {
    const res = analyzeChain(doc, { sweep: false });
    const cautions = res.flags.filter((f) => f.code === 'caution');
    if (cautions.length === 0) return;
    expect(doc.description).toMatch(/Caution:/);
    expect(doc.description).toMatch(/licensed practice/);
    if (cautions.some((c) => c.data?.caution === 'high-voltage')) {
      expect(doc.description).toMatch(/injure or kill/);
      expect(doc.description).toMatch(/electrical codes/);
    }
    if (cautions.some((c) => c.data?.caution === 'transmit')) {
      expect(doc.description).toMatch(/licen[cs]e/);
      expect(doc.description).toMatch(/RF exposure/);
    }
  });
});

function defaults(info: StageTypeInfo): Record<string, unknown> {
  return Object.fromEntries(info.params.map((p) => [p.key, p.default]));
}
