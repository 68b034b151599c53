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

  it("should write the results at the reader's figures with their trailing zeros, counts whole", () => {
    const before = {
      ...figures(10, 0),
      levels: { ...figures(10, 0).levels, noiseFigureDb: 3.14159 },
    };
    const after = figures(12.5, 2);
    const at = (digits: number, key: string) =>
      keyFigures(before, after, digits).find((r) => r.key === key);
    expect(at(3, 'totalGainDb')).toMatchObject({ beforeText: '10.0 dB', afterText: '12.5 dB' });
    expect(at(3, 'noiseFigureDb')).toMatchObject({ beforeText: '3.14 dB', afterText: '3.00 dB' });
    expect(at(3, 'bw3dbHz')).toMatchObject({ afterText: '12.0 kHz' });
    expect(at(6, 'totalGainDb')).toMatchObject({
      beforeText: '10.0000 dB',
      afterText: '12.5000 dB',
    });
    expect(at(6, 'noiseFigureDb')).toMatchObject({ beforeText: '3.14159 dB' });
    expect(at(6, 'sensitivityDbm')).toMatchObject({ afterText: '-120.000 dBm' });
    expect(at(6, 'bw3dbHz')).toMatchObject({ afterText: '12.0000 kHz' });
    expect(at(6, 'flags')).toMatchObject({ beforeText: '0', afterText: '2' });
    expect(at(6, 'iip3Dbm')).toMatchObject({ beforeText: '—', afterText: '—' });
  });
});

describe("diffChains at the reader's figures", () => {
  it('should round the values and settings as stated, never padding them', () => {
    const before = doc(base([S('src'), S('t1', 'shunt-lc-tank', { l: 4.71234e-6 }), S('load')]));
    const after = doc({
      ...base([S('src'), S('t1', 'shunt-lc-tank', { l: 10e-6 }), S('load')]),
      settings: { f0Hz: 7.123456e6, sweep: { startHz: 5e5, stopHz: 2e6, points: 11 } },
    });
    const at = (digits: number) => diffChains(before, after, paramsOf, digits);
    expect(at(3).values[0]).toMatchObject({ beforeText: '4.71 µH', afterText: '10 µH' });
    expect(at(6).values[0]).toMatchObject({ beforeText: '4.71234 µH', afterText: '10 µH' });
    expect(at(3).settings).toEqual([{ key: 'f0Hz', before: '1 MHz', after: '7.12 MHz' }]);
    expect(at(6).settings).toEqual([{ key: 'f0Hz', before: '1 MHz', after: '7.12346 MHz' }]);
  });
});
