/** How many variants fit side by side. */
export const MAX_COMPARED = 6;

/** The chain ids of `chains=<id>,<id>,…`: trimmed, without blanks or repeats, at most six. */
export function parseChainIds(text: string | null | undefined): string[] {
  const ids = (text ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
  return [...new Set(ids)].slice(0, MAX_COMPARED);
}

/**
 * One column of the comparison: a chain, or one mode of a chain (`<chain id>:<mode id>`;
 * mode ids are slugs, chain ids UUIDs, so the colon never belongs to either).
 */
export interface CompareEntry {
  chainId: string;
  modeId: string | null;
}

export function parseEntry(text: string): CompareEntry {
  const at = text.indexOf(':');
  return at < 0
    ? { chainId: text, modeId: null }
    : { chainId: text.slice(0, at), modeId: text.slice(at + 1) || null };
}

export function entryKey(entry: CompareEntry): string {
  return entry.modeId ? `${entry.chainId}:${entry.modeId}` : entry.chainId;
}
