import type { ParamSpec } from '../../../../shared/engine/types';
import type { PartDto } from '../../../../shared/schema/api';
import type { StageInstance } from '../../../../shared/schema/chain';
import { describePartRef, qKeyFor, withoutPart, withPart } from './with-part';

const num = (key: string, unit: ParamSpec['unit'], tolerance = false): ParamSpec => ({
  key,
  label: key,
  kind: 'number',
  unit,
  default: 1,
  tolerance,
});
const TANK = [
  num('l', 'henry', true),
  num('ql', 'ratio'),
  num('c', 'farad', true),
  num('qc', 'ratio'),
];
const CAP: PartDto = {
  id: 'p1',
  partNumber: 'C-150P',
  kind: 'capacitor',
  value: 150e-12,
  q: 800,
  qFreqHz: 7e6,
  tolerancePct: 2,
  notes: '',
};
const stage: StageInstance = { id: 'tank', type: 'shunt-lc-tank', label: '', values: { c: 1e-10 } };

describe('taking a value from the parts bin', () => {
  it('finds the Q parameter of each component', () => {
    expect(qKeyFor(TANK, TANK[0])).toBe('ql');
    expect(qKeyFor(TANK, TANK[2])).toBe('qc');
    const coupled = [
      num('l1', 'henry'),
      num('l2', 'henry'),
      num('q1', 'ratio'),
      num('q2', 'ratio'),
    ];
    expect(qKeyFor(coupled, coupled[1])).toBe('q2');
    expect(qKeyFor([num('c', 'farad')], num('c', 'farad'))).toBeNull();
  });

  it('sets the value, the Q and the tolerance, and keeps a reference to the part', () => {
    const next = withPart(stage, TANK[2], TANK, CAP);
    expect(next.values).toEqual({ c: 150e-12, qc: 800 });
    expect(next.tolerances).toEqual({ c: 2 });
    expect(next.entered?.['c']).toBe('150 pF');
    expect(next.parts).toEqual({
      c: { partId: 'p1', partNumber: 'C-150P', q: 800, qFreqHz: 7e6, tolerancePct: 2 },
    });
    expect(describePartRef(next.parts!['c'])).toBe('From the bin: C-150P, Q 800 at 7 MHz, ± 2 %');
    expect(withoutPart(next, 'c').parts).toBeUndefined();
  });
});
