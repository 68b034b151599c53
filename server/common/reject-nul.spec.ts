import { findNul } from './reject-nul';

describe('findNul', () => {
  it('should find a NUL in a nested string or key and give its path', () => {
    expect(findNul({ a: [{ b: 'ok' }, { c: 'x\u0000y' }] })).toEqual(['a', '1', 'c']);
    expect(findNul({ ['k\u0000']: 1 })).toEqual(['k\u0000']);
  });

  it('should pass bodies without one', () => {
    expect(findNul({ a: 'plain', n: 3, t: true, z: null })).toBeNull();
    expect(findNul(undefined)).toBeNull();
  });
});
