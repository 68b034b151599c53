/**
 * Unsaved edits kept in localStorage, keyed by chain id and the version they started
 * from, so a reload or a crashed tab loses nothing. A draft of an older version is still
 * offered: restoring it and saving then meets the normal conflict check.
 */
import { chainDocumentSchema, type ChainDocument } from '../../../../../shared/schema/chain';

const PREFIX = 'cw-draft:';

export interface Draft {
  chainId: string;
  version: number;
  savedAt: string;
  document: ChainDocument;
}

function key(chainId: string, version: number): string {
  return `${PREFIX}${chainId}:${version}`;
}

function storage(): Storage | null {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null; // storage blocked by the browser's privacy settings
  }
}

export function writeDraft(chainId: string, version: number, document: ChainDocument): void {
  const draft: Draft = { chainId, version, savedAt: new Date().toISOString(), document };
  try {
    storage()?.setItem(key(chainId, version), JSON.stringify(draft));
  } catch {
    // Quota full: the edit is still in memory and the leave guard still warns.
  }
}

/** The newest readable draft of the chain, at `version` or any other version. */
export function readDraft(chainId: string): Draft | null {
  const store = storage();
  if (!store) return null;
  const drafts: Draft[] = [];
  for (let i = 0; i < store.length; i++) {
    const k = store.key(i);
    if (!k?.startsWith(`${PREFIX}${chainId}:`)) continue;
    const draft = parseDraft(store.getItem(k));
    if (draft) drafts.push(draft);
  }
  drafts.sort((a, b) => b.savedAt.localeCompare(a.savedAt));
  return drafts[0] ?? null;
}

/** Removes every draft of the chain (after a save, a reload of theirs, or a discard). */
export function clearDrafts(chainId: string): void {
  const store = storage();
  if (!store) return;
  const keys: string[] = [];
  for (let i = 0; i < store.length; i++) {
    const k = store.key(i);
    if (k?.startsWith(`${PREFIX}${chainId}:`)) keys.push(k);
  }
  keys.forEach((k) => store.removeItem(k));
}

function parseDraft(text: string | null): Draft | null {
  if (!text) return null;
  try {
    const raw = JSON.parse(text) as Partial<Draft>;
    const document = chainDocumentSchema.safeParse(raw.document);
    if (!document.success || typeof raw.chainId !== 'string' || typeof raw.version !== 'number') {
      return null;
    }
    return {
      chainId: raw.chainId,
      version: raw.version,
      savedAt: String(raw.savedAt ?? ''),
      document: document.data,
    };
  } catch {
    return null;
  }
}
