import { HistoryStore } from './chain-history.store';

describe('HistoryStore', () => {
  describe('undo and redo', () => {
    it('should start with nothing to undo or redo', () => {
      const h = new HistoryStore('a');
      expect(h.present()).toBe('a');
      expect(h.canUndo()).toBe(false);
      expect(h.canRedo()).toBe(false);
      expect(h.undo()).toBe(false);
      expect(h.redo()).toBe(false);
    });

    it('should step back and forward through commits', () => {
      const h = new HistoryStore('a');
      h.commit('b');
      h.commit('c');
      expect(h.undo()).toBe(true);
      expect(h.present()).toBe('b');
      expect(h.undo()).toBe(true);
      expect(h.present()).toBe('a');
      expect(h.canUndo()).toBe(false);
      expect(h.redo()).toBe(true);
      expect(h.present()).toBe('b');
      expect(h.canRedo()).toBe(true);
    });

    it('should drop the redo steps when a new edit is made after undo', () => {
      const h = new HistoryStore('a');
      h.commit('b');
      h.undo();
      h.commit('x');
      expect(h.canRedo()).toBe(false);
      h.undo();
      expect(h.present()).toBe('a');
    });
  });

  describe('coalescing', () => {
    it('should merge consecutive commits with the same key into one step', () => {
      const h = new HistoryStore('');
      h.commit('2', 'l');
      h.commit('22', 'l');
      h.commit('22 uH', 'l');
      expect(h.present()).toBe('22 uH');
      h.undo();
      expect(h.present()).toBe('');
    });

    it('should not merge across different keys or after an undo', () => {
      const h = new HistoryStore('0');
      h.commit('1', 'l');
      h.commit('2', 'c');
      h.undo();
      h.commit('3', 'c');
      h.undo();
      expect(h.present()).toBe('1');
    });
  });

  describe('reset', () => {
    it('should forget every step', () => {
      const h = new HistoryStore('a');
      h.commit('b');
      h.reset('z');
      expect(h.present()).toBe('z');
      expect(h.canUndo()).toBe(false);
    });
  });
});
