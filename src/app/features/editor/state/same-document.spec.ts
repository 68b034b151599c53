import { sameJson } from './same-document';

describe('sameJson', () => {
  it('should ignore key order at every depth', () => {
    expect(
      sameJson({ a: 1, b: { c: [1, { d: 2, e: 3 }] } }, { b: { c: [1, { e: 3, d: 2 }] }, a: 1 }),
    ).toBe(true);
  });

  it('should treat an undefined key as absent', () => {
    expect(sameJson({ a: 1, entered: undefined }, { a: 1 })).toBe(true);
  });

  it('should see a changed value or array order', () => {
    expect(sameJson({ a: 1 }, { a: 2 })).toBe(false);
    expect(sameJson([1, 2], [2, 1])).toBe(false);
  });
});
