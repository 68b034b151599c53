/** Something listed with an optional parent (a variant points at the chain it came from). */
interface Listed {
  id: string;
  parentId?: string | null;
}

/**
 * The list reordered so each variant follows its parent (and the parent's earlier variants),
 * with `nested` set on variants whose parent is in the list. Order is otherwise kept.
 */
export function underParents<T extends Listed>(
  items: readonly T[],
): { item: T; nested: boolean }[] {
  const ids = new Set(items.map((i) => i.id));
  const children = new Map<string, T[]>();
  for (const item of items) {
    if (item.parentId && ids.has(item.parentId) && item.parentId !== item.id) {
      children.set(item.parentId, [...(children.get(item.parentId) ?? []), item]);
    }
  }
  const out: { item: T; nested: boolean }[] = [];
  const placed = new Set<string>();
  const place = (item: T, nested: boolean) => {
    if (placed.has(item.id)) return;
    placed.add(item.id);
    out.push({ item, nested });
    for (const child of children.get(item.id) ?? []) place(child, true);
  };
  for (const item of items) {
    const nestedHere = !!item.parentId && ids.has(item.parentId);
    if (!nestedHere) place(item, false);
  }
  // Anything left (a cycle) keeps its place at the end.
  for (const item of items) place(item, false);
  return out;
}
