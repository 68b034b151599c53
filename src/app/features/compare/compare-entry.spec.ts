import type { ChainSummaryDto } from '../../../../shared/schema/api';
import { compareQueryOf, inFamily } from './compare-entry';
import { parseChainIds } from './compare-ids';

const member = (id: string, parentId: string | null = null): ChainSummaryDto => ({
  id,
  parentId,
  workspaceId: 'w',
  name: id,
  description: '',
  f0Hz: 7.2e6,
  stageCount: 7,
  flagCount: 0,
  version: 1,
  createdBy: 'a',
  updatedBy: 'a',
  updatedAt: '2026-01-01T00:00:00Z',
});

describe('parseChainIds', () => {
  it('should split, trim and drop blanks and repeats, keeping at most six', () => {
    expect(parseChainIds(' a, b,,a ,c ')).toEqual(['a', 'b', 'c']);
    expect(parseChainIds(undefined)).toEqual([]);
    expect(parseChainIds('1,2,3,4,5,6,7,8')).toHaveLength(6);
  });
});

describe('compareQueryOf', () => {
  it('should offer nothing for a chain without relatives', () => {
    expect(compareQueryOf([member('a')], 'a')).toBeNull();
    expect(compareQueryOf([], 'a')).toBeNull();
  });

  it('should list the family in its order', () => {
    const family = [member('root'), member('v1', 'root'), member('v2', 'v1')];
    expect(compareQueryOf(family, 'v1')).toEqual({ chains: 'root,v1,v2' });
  });

  it('should always keep the chain itself when the family is larger than six', () => {
    const family = ['r', 'a', 'b', 'c', 'd', 'e', 'f', 'g'].map((id) => member(id, 'r'));
    const ids = compareQueryOf(family, 'g')!.chains.split(',');
    expect(ids).toHaveLength(6);
    expect(ids).toContain('g');
  });
});

describe('inFamily', () => {
  it('should hold for variants and for chains with variants only', () => {
    expect(inFamily({ parentId: 'p', variantCount: 0 })).toBe(true);
    expect(inFamily({ parentId: null, variantCount: 2 })).toBe(true);
    expect(inFamily({ parentId: null, variantCount: 0 })).toBe(false);
    expect(inFamily({ parentId: null })).toBe(false);
  });
});
