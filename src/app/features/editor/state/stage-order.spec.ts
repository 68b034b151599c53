import type { StageInstance } from '../../../../../shared/schema/chain';
import {
  duplicateStage,
  insertStage,
  moveImmutably,
  moveStage,
  removeStage,
  type RoleOf,
} from './stage-order';

describe('stage order helpers', () => {
  describe('moveImmutably', () => {
    it('should return an equal copy when moving to the same index', () => {
      const items = [1, 2, 3];
      const moved = moveImmutably(items, 1, 1);
      expect(moved).toEqual([1, 2, 3]);
      expect(moved).not.toBe(items);
    });

    it('should clamp an index past the end to the last position', () => {
      expect(moveImmutably([1, 2, 3], 0, 10)).toEqual([2, 3, 1]);
    });

    it('should clamp a negative index to the first position', () => {
      expect(moveImmutably([1, 2, 3], 2, -4)).toEqual([3, 1, 2]);
    });

    it('should never mutate its input', () => {
      const items = Object.freeze([1, 2, 3, 4]);
      expect(moveImmutably(items, 3, 0)).toEqual([4, 1, 2, 3]);
      expect(items).toEqual([1, 2, 3, 4]);
    });

    it('should return an empty copy for an empty list', () => {
      expect(moveImmutably([], 0, 3)).toEqual([]);
    });
  });

  describe('moveStage', () => {
    it('should move a two-port between the source and the load', () => {
      const result = moveStage(chain(), roleOf, 1, 2);
      expect(result.ok && ids(result.stages)).toEqual(['src', 'b', 'a', 'load']);
    });

    it('should refuse to move the source', () => {
      expect(moveStage(chain(), roleOf, 0, 2)).toEqual({
        ok: false,
        reason: 'The source always stays first in the chain.',
      });
    });

    it('should refuse to move the load', () => {
      expect(moveStage(chain(), roleOf, 3, 1)).toMatchObject({
        ok: false,
        reason: expect.stringMatching(/load always stays last/),
      });
    });

    it('should refuse to put a two-port before the source', () => {
      expect(moveStage(chain(), roleOf, 2, 0)).toMatchObject({
        ok: false,
        reason: expect.stringMatching(/source stays first/),
      });
    });

    it('should refuse to put a two-port after the load', () => {
      expect(moveStage(chain(), roleOf, 1, 3)).toMatchObject({
        ok: false,
        reason: expect.stringMatching(/load stays last/),
      });
    });

    it('should refuse an index outside the chain', () => {
      expect(moveStage(chain(), roleOf, -1, 1)).toEqual({
        ok: false,
        reason: 'There is no stage there.',
      });
    });
  });

  describe('insertStage', () => {
    it('should insert a two-port at the dropped index', () => {
      const result = insertStage(chain(), roleOf, st('new', 'two-port'), 2);
      expect(result.ok && ids(result.stages)).toEqual(['src', 'a', 'new', 'b', 'load']);
    });

    it('should replace the source whatever the index', () => {
      const result = insertStage(chain(), roleOf, st('src2', 'source'), 3);
      expect(result).toMatchObject({ ok: true, note: 'replaced-source' });
      expect(result.ok && ids(result.stages)).toEqual(['src2', 'a', 'b', 'load']);
    });

    it('should replace the load whatever the index', () => {
      const result = insertStage(chain(), roleOf, st('load2', 'load'), 0);
      expect(result.ok && ids(result.stages)).toEqual(['src', 'a', 'b', 'load2']);
    });

    it('should refuse a two-port dropped before the source', () => {
      expect(insertStage(chain(), roleOf, st('new', 'two-port'), 0).ok).toBe(false);
    });

    it('should refuse a two-port dropped after the load', () => {
      expect(insertStage(chain(), roleOf, st('new', 'two-port'), 4).ok).toBe(false);
    });

    it('should accept a two-port right before the load', () => {
      const result = insertStage(chain(), roleOf, st('new', 'two-port'), 3);
      expect(result.ok && ids(result.stages)).toEqual(['src', 'a', 'b', 'new', 'load']);
    });
  });

  describe('removeStage and duplicateStage', () => {
    it('should remove a two-port', () => {
      const result = removeStage(chain(), roleOf, 1);
      expect(result.ok && ids(result.stages)).toEqual(['src', 'b', 'load']);
    });

    it('should refuse to remove the source and say how to replace it', () => {
      expect(removeStage(chain(), roleOf, 0)).toMatchObject({
        ok: false,
        reason: expect.stringMatching(/drop another source/),
      });
    });

    it('should put a copy with a new id right after the original', () => {
      const stages = chain();
      const result = duplicateStage(stages, roleOf, 1, 'a2');
      expect(result.ok && ids(result.stages)).toEqual(['src', 'a', 'a2', 'b', 'load']);
      expect(result.ok && result.stages[2].values).toEqual(stages[1].values);
      expect(result.ok && result.stages[2].values).not.toBe(stages[1].values);
    });

    it('should refuse to duplicate the load', () => {
      expect(duplicateStage(chain(), roleOf, 3, 'x').ok).toBe(false);
    });
  });
});

// Helpers

const roles: Record<string, 'source' | 'two-port' | 'load'> = {};
const roleOf: RoleOf = (s) => roles[s.id] ?? 'two-port';

function st(id: string, role: 'source' | 'two-port' | 'load'): StageInstance {
  roles[id] = role;
  return { id, type: role, label: id, values: { x: 1 } };
}

function chain(): StageInstance[] {
  return [st('src', 'source'), st('a', 'two-port'), st('b', 'two-port'), st('load', 'load')];
}

function ids(stages: StageInstance[]): string[] {
  return stages.map((s) => s.id);
}
