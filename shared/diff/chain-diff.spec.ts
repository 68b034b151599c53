import type { ParamSpec } from '../engine/types';
import { chainDocumentSchema, type ChainDocumentInput } from '../schema/chain';
import { diffChains, keyFigures } from './chain-diff';

const PARAMS: Record<string, ParamSpec[]> = {
  'shunt-lc-tank': [
    { key: 'l', label: 'Inductance', kind: 'number', unit: 'henry', default: 1e-5 },
    { key: 'c', label: 'Capacitance', kind: 'number', unit: 'farad', default: 1e-10 },
  ],
};
const paramsOf = (type: string) => PARAMS[type] ?? [];

const base = (stages: ChainDocumentInput['stages']): ChainDocumentInput => ({
  name: 'Diff test',
  settings: { f0Hz: 1e6, sweep: { startHz: 5e5, stopHz: 2e6, points: 11 } },
  stages,
});
const doc = (d: ChainDocumentInput) => chainDocumentSchema.parse(d);
const S = (id: string, type = 'shunt-lc-tank', values: Record<string, number> = {}) => ({
  id,
  type,
  label: id.toUpperCase(),
  values,
});

describe('diffChains', () => {
  it('should find added, removed and values changed, with units', () => {
    const before = doc(
      base([
        S('src', 'gen'),
        S('t1', 'shunt-lc-tank', { l: 22e-6, c: 100e-12 }),
        S('x'),
        S('load', 'det'),
      ]),
    );
    const after = doc(
      base([
        S('src', 'gen'),
        S('t1', 'shunt-lc-tank', { l: 10e-6, c: 100e-12 }),
        S('t2'),
        S('load', 'det'),
      ]),
    );
    const d = diffChains(before, after, paramsOf);
    expect(d.added).toEqual([{ id: 't2', type: 'shunt-lc-tank', label: 'T2', position: 3 }]);
    expect(d.removed).toEqual([{ id: 'x', type: 'shunt-lc-tank', label: 'X', position: 3 }]);
    expect(d.moved).toEqual([]);
    expect(d.values).toEqual([
      expect.objectContaining({
        stageId: 't1',
        label: 'Inductance',
        unit: 'henry',
        before: 22e-6,
        after: 10e-6,
        beforeText: '22 µH',
        afterText: '10 µH',
      }),
    ]);
  });

  it('should count one stage dragged to the front as one move, not every stage shifted', () => {
    const ids = ['src', 'a', 'b', 'c', 'd', 'load'];
    const before = doc(base(ids.map((id) => S(id))));
    const after = doc(base(['src', 'd', 'a', 'b', 'c', 'load'].map((id) => S(id))));
    const d = diffChains(before, after, paramsOf);
    expect(d.moved).toEqual([{ id: 'd', type: 'shunt-lc-tank', label: 'D', position: 2, from: 5 }]);
  });

  it('should list settings changed with engineering units', () => {
    const before = doc(base([S('src'), S('load')]));
    const after = doc({
      ...base([S('src'), S('load')]),
      settings: { f0Hz: 7.2e6, sweep: { startHz: 5e5, stopHz: 2e6, points: 401 } },
    });
    const d = diffChains(before, after, paramsOf);
    expect(d.settings).toEqual([
      { key: 'f0Hz', before: '1 MHz', after: '7.2 MHz' },
      { key: 'sweep.points', before: '11', after: '401' },
    ]);
  });
});

describe('keyFigures', () => {
  const figures = (gain: number, flags: number) => ({
    levels: {
      totalGainDb: gain,
      noiseFigureDb: 3,
      noiseFloorDbm: -130,
      sensitivityDbm: -120,
      iip3Dbm: null,
      sfdrDb: null,
    },
    selectivity: [{ bw3dbHz: 12e3 }],
    flags: Array.from({ length: flags }, () => ({ severity: 'warning' })),
  });

  it('should give each figure before and after, and a dash where it is missing', () => {
    const rows = keyFigures(figures(10, 0), figures(12.5, 2));
    expect(rows.find((r) => r.key === 'totalGainDb')).toMatchObject({
      beforeText: '10 dB',
      afterText: '12.5 dB',
    });
    expect(rows.find((r) => r.key === 'flags')).toMatchObject({ before: 0, after: 2 });
    expect(rows.find((r) => r.key === 'iip3Dbm')).toMatchObject({
      beforeText: '—',
      afterText: '—',
    });
    expect(keyFigures(null, figures(1, 0))[0].beforeText).toBe('—');
  });
});
