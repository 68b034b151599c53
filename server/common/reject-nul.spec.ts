import { checkJsonShape } from './json-body';
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

describe('the raw-bytes NUL scan (checkJsonShape)', () => {
  const scan = (text: string) => checkJsonShape(Buffer.from(text, 'utf8'));

  it('should see a \\u0000 escape in a value or a key, at any depth', () => {
    expect(scan('{"a":[{"b":"ok"},{"c":"x\\u0000y"}]}')).toBe(true);
    expect(scan('{"k\\u0000":1}')).toBe(true);
    expect(scan('"\\u0000"')).toBe(true);
  });

  it('should not take an escaped backslash before u0000, or other escapes, for a NUL', () => {
    expect(scan('{"path":"C:\\\\u0000"}')).toBe(false);
    expect(scan('{"a":"\\u00001"}')).toBe(true);
    expect(scan('{"a":"\\u0001\\u1000\\n\\"u0000"}')).toBe(false);
    expect(scan('{"u0000":"u0000"}')).toBe(false);
  });

  it('should agree with a walk of the parsed body on every mix of escapes', () => {
    const pieces = ['a', '\\\\', '\\u0000', '\\u0001', '\\"', 'u0000', '\\\\u0000', '0', 'é'];
    let checked = 0;
    for (const first of pieces) {
      for (const second of pieces) {
        for (const third of pieces) {
          const text = `{"k${first}":["${second}${third}", {"v":"${third}${first}"}]}`;
          expect(scan(text)).toBe(findNul(JSON.parse(text)) !== null);
          checked++;
        }
      }
    }
    expect(checked).toBe(pieces.length ** 3);
  });
});
