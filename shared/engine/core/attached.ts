/**
 * Data the engine keeps with an object it made for one analysis (a built chain's probe, a
 * sweep report's source, a settings object's JSON), as a property of that object under a
 * symbol of its own. The property is not enumerable: JSON, spreads, `Object.keys` and
 * structured clones never see it.
 *
 * Not in a WeakMap: V8's young-generation collector (Node 20) keeps alive every entry of a
 * WeakMap whose key is young, so each analysis's built chain, its probe and its sweep report
 * (and the source arrays behind it) survived the collections that came before the next full
 * one, were copied and promoted, and left the old generation to the full collections. An
 * analysis thread's loop promoted 1.6 MB per young collection with them; kept on the objects,
 * they die young with their keys.
 */
export interface Attachment<K extends object, V> {
  get(owner: K): V | undefined;
  /** Keeps `value` with `owner` (replacing what was kept). */
  set(owner: K, value: V): void;
}

export function attachment<K extends object, V>(name: string): Attachment<K, V> {
  const key = Symbol(name);
  return {
    get: (owner) => (owner as unknown as Record<symbol, V | undefined>)[key],
    set: (owner, value) => {
      Object.defineProperty(owner, key, { value, writable: true, configurable: true });
    },
  };
}
