import { TestBed } from '@angular/core/testing';
import { chainDto } from '../testing/chain-dto';
import { AMP, CATALOGUE, LOAD, SOURCE, TANK } from '../testing/catalogue-fixture';
import { EditorStore } from './editor.store';

describe('EditorStore', () => {
  let store: EditorStore;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [EditorStore] });
    store = TestBed.inject(EditorStore);
    store.setCatalogue(CATALOGUE);
  });

  describe('inserting from the palette', () => {
    beforeEach(() => store.load(chainDto('editor')));

    it('should insert after the selected stage and select the new one', () => {
      store.select('tank');
      expect(store.insertType(TANK)).toEqual({ ok: true });
      const ids = store.doc().stages.map((s) => s.type);
      expect(ids).toEqual(['test-source', 'test-tank', 'test-tank', 'test-amp', 'test-load']);
      expect(store.selectedId()).toBe(store.doc().stages[2].id);
    });

    it('should put a two-port just before the load when the load is selected', () => {
      store.select('load');
      store.insertType(AMP);
      expect(
        store
          .doc()
          .stages.map((s) => s.type)
          .slice(-2),
      ).toEqual(['test-amp', 'test-load']);
      expect(store.doc().stages).toHaveLength(5);
    });

    it('should replace the source and say so', () => {
      expect(store.insertType(SOURCE, 2)).toEqual({
        ok: true,
        message: 'The new source replaced the old one.',
      });
      expect(store.doc().stages).toHaveLength(4);
      expect(store.doc().stages[0].id).not.toBe('src');
    });

    it('should refuse a two-port dropped after the load, with the reason', () => {
      expect(store.insertType(TANK, 4)).toEqual({
        ok: false,
        reason: 'Stages go before the load: the load stays last.',
      });
      expect(store.canUndo()).toBe(false);
    });
  });

  describe('editing and the unsaved state', () => {
    beforeEach(() => store.load(chainDto('editor')));

    it('should be clean after loading and dirty after an edit', () => {
      expect(store.dirty()).toBe(false);
      store.moveBy('tank', 1);
      expect(store.doc().stages.map((s) => s.id)).toEqual(['src', 'amp', 'tank', 'load']);
      expect(store.dirty()).toBe(true);
    });

    it('should be clean again when undo returns to the saved document', () => {
      store.remove('amp');
      store.undo();
      expect(store.dirty()).toBe(false);
    });

    it('should take a saved answer with other key order as clean', () => {
      store.duplicate('tank');
      const saved = { ...chainDto('editor'), version: 4, document: reorderKeys(store.doc()) };
      store.markSaved(saved);
      expect(store.dirty()).toBe(false);
      expect(store.chain()?.version).toBe(4);
    });

    it('should refuse to remove the load', () => {
      expect(store.remove('load').ok).toBe(false);
      expect(store.doc().stages.at(-1)?.type).toBe(LOAD.type);
    });
  });

  describe('modes', () => {
    beforeEach(() => store.load(chainDto('editor')));

    it("should write edits in a mode as that mode's values, each one undo step", () => {
      expect(store.addMode('Band 2', 'state')).toEqual({ ok: true });
      expect(store.mode()?.id).toBe('band-2');
      const tank = store.stagesInMode()[1];
      store.updateStage(
        { ...tank, values: { ...tank.values, c: 1e-9 }, entered: { c: '1 n' } },
        'c',
      );
      store.updateStage(
        { ...tank, values: { ...tank.values, c: 2e-9 }, entered: { c: '2 n' } },
        'c',
      );
      // The chain's own value stays; the mode has the new one, shown with the text typed.
      expect(store.doc().stages[1].values['c']).toBe(tank.values['c']);
      expect(store.doc().modes![0].values).toEqual({ tank: { c: 2e-9 } });
      expect(store.stagesInMode()[1].entered?.['c']).toBe('2 n');
      // Keystrokes in one field coalesce: one undo goes back to before the override.
      store.undo();
      expect(store.doc().modes![0].values).toBeUndefined();
      store.undo();
      expect(store.doc().modes).toBeUndefined();
    });

    it("should keep the label the chain's own while a mode is shown", () => {
      store.addMode('tx', 'transmit');
      const tank = store.stagesInMode()[1];
      store.updateStage({ ...tank, label: 'Trap' }, 'label');
      expect(store.doc().stages[1].label).toBe('Trap');
      expect(store.doc().modes![0].values).toBeUndefined();
    });

    it('should clear an override, leave a stage out, and forget a removed stage', () => {
      store.addMode('rx', 'receive');
      const amp = store.stagesInMode()[2];
      store.updateStage({ ...amp, values: { ...amp.values, gain: 3 } });
      store.clearOverride('amp', 'gain');
      expect(store.mode()?.values).toBeUndefined();
      store.setLeftOut('tank', true);
      expect(store.mode()?.bypass).toEqual(['tank']);
      expect(store.remove('tank').ok).toBe(true);
      expect(store.mode()?.bypass).toBeUndefined();
    });

    it('should open a chain with modes in its first mode', () => {
      const chain = chainDto('editor');
      chain.document = {
        ...chain.document,
        modes: [
          { id: 'rx', name: 'Receive', kind: 'receive' },
          { id: 'tx', name: 'Transmit', kind: 'transmit', bypass: ['tank'] },
        ],
      };
      store.load(chain);
      expect(store.mode()?.id).toBe('rx');
      store.selectMode(null);
      expect(store.mode()).toBeNull();
    });

    it('should show the chain as written after the mode shown is deleted', () => {
      store.addMode('rx', 'receive');
      store.deleteMode('rx');
      expect(store.mode()).toBeNull();
      expect(store.doc().modes).toBeUndefined();
      store.undo();
      expect(store.modes().map((m) => m.id)).toEqual(['rx']);
    });
  });

  describe('viewers', () => {
    beforeEach(() => store.load(chainDto('viewer')));

    it('should refuse every edit', () => {
      expect(store.readOnly()).toBe(true);
      expect(store.insertType(TANK).ok).toBe(false);
      store.updateStage({ ...store.doc().stages[1], label: 'changed' });
      expect(store.doc().stages[1].label).toBe('Test tank');
      expect(store.dirty()).toBe(false);
    });
  });
});

// Helpers

function reorderKeys<T>(value: T): T {
  if (Array.isArray(value)) return value.map(reorderKeys) as T;
  if (value && typeof value === 'object') {
    return Object.fromEntries(
      Object.entries(value as Record<string, unknown>)
        .reverse()
        .map(([k, v]) => [k, reorderKeys(v)]),
    ) as T;
  }
  return value;
}
