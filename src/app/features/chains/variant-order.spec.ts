import { underParents } from './variant-order';

describe('underParents', () => {
  it('puts each variant right under its parent, nested', () => {
    const list = [
      { id: 'b1', parentId: 'a' },
      { id: 'x' },
      { id: 'a' },
      { id: 'b2', parentId: 'a' },
    ];
    expect(underParents(list).map((r) => `${r.item.id}${r.nested ? '>' : ''}`)).toEqual([
      'x',
      'a',
      'b1>',
      'b2>',
    ]);
  });

  it('keeps a variant whose parent is not on the page where it was, not nested', () => {
    const list = [{ id: 'v', parentId: 'elsewhere' }, { id: 'y' }];
    expect(underParents(list).map((r) => [r.item.id, r.nested])).toEqual([
      ['v', false],
      ['y', false],
    ]);
  });
});
