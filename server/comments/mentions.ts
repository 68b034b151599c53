/** Addresses written as "@name@example.org" or plainly in a comment, lower-cased, once each. */
export function mentionedAddresses(body: string): string[] {
  const found = body.match(/[A-Za-z0-9._%+-]+@[A-Za-z0-9-]+(?:\.[A-Za-z0-9-]+)+/g) ?? [];
  return [...new Set(found.map((a) => a.replace(/^@/, '').toLowerCase()))];
}
