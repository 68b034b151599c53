import { AMP, TANK, stage } from '../testing/catalogue-fixture';
import {
  createStage,
  displayText,
  keyValues,
  visibleParams,
  withPreset,
  withTolerance,
  withValue,
} from './stage-factory';

describe('stage factory', () => {
  describe('createStage', () => {
    it('should fill every parameter with its catalogue default', () => {
      const s = createStage(TANK, 'id1');
      expect(s).toEqual({
        id: 'id1',
        type: 'test-tank',
        label: 'Test tank',
        values: { l: 22e-6, c: 100e-12, mode: 'values', q: 20, lossy: true },
      });
    });

    it('should give each new stage its own id', () => {
      expect(createStage(TANK).id).not.toBe(createStage(TANK).id);
    });
  });

  describe('visibleParams', () => {
    it('should hide a parameter whose showWhen does not hold', () => {
      const keys = visibleParams(stage('t', TANK, { mode: 'values' }), TANK).map((p) => p.key);
      expect(keys).toEqual(['l', 'c', 'mode', 'lossy']);
    });

    it('should show it when the controlling value matches', () => {
      const keys = visibleParams(stage('t', TANK, { mode: 'design' }), TANK).map((p) => p.key);
      expect(keys).toContain('q');
    });

    it('should use the default of the controlling parameter when it is not set', () => {
      expect(visibleParams(stage('t', TANK), TANK).map((p) => p.key)).not.toContain('q');
    });
  });

  describe('displayText and keyValues', () => {
    it('should prefer what the user typed', () => {
      const s = withValue(stage('t', TANK), 'l', 22e-6, '22u');
      expect(displayText(s, TANK.params[0])).toBe('22u');
    });

    it('should write a stored value with an engineering prefix', () => {
      expect(displayText(stage('t', TANK, { l: 4.7e-6 }), TANK.params[0])).toBe('4.7 µH');
    });

    it('should give the card the parts first, with full labels, and leave out the entry switch', () => {
      const values = keyValues(stage('t', TANK, { l: 22e-6, c: 100e-12 }), TANK);
      expect(values.map((v) => `${v.label} ${v.value}`)).toEqual([
        'Inductance 22 µH',
        'Capacitance 100 pF',
      ]);
    });

    it('should lead with the parts a design chose when the stage is entered by design', () => {
      // As the matching networks do: the part values are inputs in values mode only.
      const whenValues = { key: 'mode', equals: 'values' };
      const matching = {
        ...TANK,
        params: TANK.params.map((p) =>
          p.key === 'l' || p.key === 'c' ? { ...p, showWhen: whenValues } : p,
        ),
      };
      const designedTank = stage('t', matching, { mode: 'design', q: 30 });
      const values = keyValues(designedTank, matching, 4, { l: 4.7e-6, c: 220e-12 });
      expect(values.map((v) => `${v.label} ${v.value}`)).toEqual([
        'Inductance (designed) 4.700 µH',
        'Capacitance (designed) 220.0 pF',
        'Loaded Q 30',
      ]);
    });

    it('should never shorten a long label', () => {
      const long = {
        ...TANK,
        params: [
          { ...TANK.params[0], label: 'Turns ratio (primary : secondary)', unit: 'ratio' as const },
        ],
      };
      expect(keyValues(stage('t', long, { l: 0.25 }), long)[0]).toEqual({
        key: 'l',
        label: 'Turns ratio (primary : secondary)',
        value: '0.25',
        numeric: true,
      });
    });
  });

  describe('value updates', () => {
    it('should store the SI value and the typed text, leaving the input unchanged', () => {
      const before = stage('t', TANK, { l: 1e-6 });
      const after = withValue(before, 'l', 22e-6, '22 uH');
      expect(after.values['l']).toBe(22e-6);
      expect(after.entered).toEqual({ l: '22 uH' });
      expect(before.values['l']).toBe(1e-6);
      expect(before.entered).toBeUndefined();
    });

    it('should drop typed texts of the keys a preset sets', () => {
      const typed = withValue(stage('a', AMP), 'gain', 15, '15 dB');
      const after = withPreset(typed, AMP.presets![0].values);
      expect(after.values['gain']).toBe(10);
      expect(after.entered).toBeUndefined();
    });

    it('should set and clear a tolerance', () => {
      const withTol = withTolerance(stage('t', TANK), 'l', 5);
      expect(withTol.tolerances).toEqual({ l: 5 });
      expect(withTolerance(withTol, 'l', null).tolerances).toBeUndefined();
    });
  });
});
