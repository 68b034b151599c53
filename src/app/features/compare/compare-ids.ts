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
