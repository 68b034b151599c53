/**
 * Every catalogue two-port, source and load through the engine's own analysis: each must
 * build inside a chain and give finite node reports (a smoke test of the contract between
 * the catalogue and the core, not of the numbers, which the other stage tests check).
 */
import { analyzeChain } from '../../shared/engine';
import { STAGE_DEFINITIONS } from '../../shared/engine/stages';
import { parseChainDocument } from '../../shared/schema/parse-chain';

// Types with a text parameter wait for the core's validator to accept parameter kind
// 'text'; they are checked standalone in stages-elements.test.ts.
const TEXT_TYPES = new Set(
  STAGE_DEFINITIONS.filter((d) => d.params.some((p) => p.kind === 'text')).map((d) => d.type),
);

const settings = {
  f0Hz: 10e6,
  sweep: { startHz: 1e6, stopHz: 100e6, points: 201, scale: 'log' as const },
};

function chainWith(source: string, middle: string[], load: string) {
  return parseChainDocument({
    name: 'catalogue smoke chain',
    settings,
    stages: [
      { id: 'src', type: source, values: {} },
      ...middle.map((type, i) => ({ id: `s${i}`, type, values: {} })),
      { id: 'load', type: load, values: {} },
    ],
  });
}

describe('catalogue stages inside a chain', () => {
  const twoPorts = STAGE_DEFINITIONS.filter(
    (d) => d.role === 'two-port' && !TEXT_TYPES.has(d.type),
  );

  it.each(twoPorts.map((d) => [d.type]))(
    '%s analyses between a generator and an R ∥ C load',
    (type) => {
      const result = analyzeChain(chainWith('resistive-generator', [type], 'rc-load'));
      expect(result.nodes).toHaveLength(2); // node 0 (source terminal) and node 1 (load terminal)
      for (const n of result.nodes) {
        expect(Number.isFinite(n.zIn.re) && Number.isFinite(n.vPeak)).toBe(true);
      }
      const declared = STAGE_DEFINITIONS.find((d) => d.type === type)?.build(
        { ...defaultsOf(type) },
        {
          f0Hz: 10e6,
          temperatureK: 290,
        },
      ).resonators;
      expect(result.resonators).toHaveLength(declared?.length ?? 0);
    },
  );

  it.each(
    STAGE_DEFINITIONS.filter((d) => d.role !== 'two-port' && !TEXT_TYPES.has(d.type)).map((d) => [
      d.type,
      d.role,
    ]),
  )('%s (%s) analyses at one end of a chain', (type, role) => {
    const chain =
      role === 'source'
        ? chainWith(type, ['shunt-lc-tank'], 'rc-load')
        : chainWith('resistive-generator', ['shunt-lc-tank'], type);
    const result = analyzeChain(chain);
    expect(result.nodes.every((n) => Number.isFinite(n.vPeak))).toBe(true);
  });

  it('a whole receiver of our own (whip, tapped coil, tank, amplifier, bandpass, mixer, IF, detector)', () => {
    const result = analyzeChain(
      chainWith(
        'short-monopole',
        [
          'tapped-coil',
          'shunt-lc-tank',
          'unilateral-amplifier',
          'coupled-bandpass',
          'mixer',
          'if-filter',
          'unilateral-amplifier',
        ],
        'envelope-detector',
      ),
    );
    expect(result.stages).toHaveLength(7);
    // The mixer moves everything after it to the 455 kHz IF.
    expect(result.stages[5].fOutHz).toBeCloseTo(455e3, 3);
    expect(result.resonators.length).toBe(3);
  });
});

function defaultsOf(type: string) {
  const d = STAGE_DEFINITIONS.find((x) => x.type === type);
  return Object.fromEntries((d?.params ?? []).map((p) => [p.key, p.default]));
}
