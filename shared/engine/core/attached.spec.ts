import { attachment } from './attached';

describe('data kept with an object (attachment)', () => {
  it('is read back from the object it was kept with, and from no other', () => {
    const probe = attachment<object, number[]>('probe');
    const a = { stages: 3 };
    const b = { stages: 3 };
    const kept = [1, 2];
    probe.set(a, kept);
    expect(probe.get(a)).toBe(kept);
    expect(probe.get(b)).toBeUndefined();
    probe.set(a, [3]);
    expect(probe.get(a)).toEqual([3]);
  });

  it('is unseen by JSON, spreads, keys and structured clones', () => {
    const source = attachment<Record<string, unknown>, { big: Float64Array }>('source');
    const report = { points: 2, freqsHz: [1e6, 2e6] };
    source.set(report, { big: new Float64Array(4) });
    expect(JSON.stringify(report)).toBe('{"points":2,"freqsHz":[1000000,2000000]}');
    expect(Object.keys(report)).toEqual(['points', 'freqsHz']);
    const spread = { ...report };
    expect(source.get(spread)).toBeUndefined();
    expect(source.get(structuredClone(report))).toBeUndefined();
    expect(source.get(report)?.big).toHaveLength(4);
  });

  it('keeps two attachments of the same name apart', () => {
    const one = attachment<object, string>('same');
    const two = attachment<object, string>('same');
    const owner = {};
    one.set(owner, 'first');
    two.set(owner, 'second');
    expect([one.get(owner), two.get(owner)]).toEqual(['first', 'second']);
  });
});
