/**
 * A short-lived in-process cache in front of the PostgreSQL session store, so a client
 * sending many requests a second (the value knob, a plot being dragged) costs one session
 * read every few seconds instead of one per request. Writes go through to the store first;
 * whatever ends sessions in SQL directly (a password change, an account deactivated or
 * deleted) calls `forgetCachedSessions()`. The server is the only process that serves
 * sessions, so no other process can leave this cache stale; within the process a read
 * that started before a write or an end never fills the cache (generation check).
 */
import session, { type SessionData, type Store } from 'express-session';
import { LRUCache } from 'lru-cache';
import { forgetCachedUsers } from './user-cache';

/** How long a session read stays fresh, ms. */
export const SESSION_CACHE_MS = 2000;
/** Sessions kept at most (the least recently used go first). */
const MAX_ENTRIES = 10_000;

type Callback = (err?: unknown) => void;

/** Every cache in the process (weakly: a test's app and its store may be dropped). */
const caches = new Set<WeakRef<CachedSessionStore>>();

/** Drops every cached session (after sessions were ended in SQL, not through the store). */
export function forgetCachedSessions(): void {
  // The signed-in users kept in memory go too: what ends sessions in SQL changed accounts.
  forgetCachedUsers();
  for (const ref of caches) {
    const cache = ref.deref();
    if (cache) cache.forgetAll();
    else caches.delete(ref);
  }
}

export class CachedSessionStore extends session.Store {
  /** The session's JSON text (each reader gets its own copy to change). */
  private readonly fresh: LRUCache<string, string>;
  /** Bumped by every write or end: a read begun before one does not fill the cache. */
  private generation = 0;

  constructor(
    private readonly inner: Store,
    ttlMs = SESSION_CACHE_MS,
  ) {
    super();
    this.fresh = new LRUCache<string, string>({ max: MAX_ENTRIES, ttl: ttlMs });
    // express-session stops using a store that reports itself disconnected.
    for (const event of ['connect', 'disconnect']) inner.on(event, () => this.emit(event));
    caches.add(new WeakRef(this));
  }

  forgetAll(): void {
    this.generation++;
    this.fresh.clear();
  }

  get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): void {
    const hit = this.fresh.get(sid);
    if (hit !== undefined) return callback(null, JSON.parse(hit) as SessionData);
    const began = this.generation;
    this.inner.get(sid, (err, data) => {
      if (!err && data && began === this.generation) this.fresh.set(sid, JSON.stringify(data));
      callback(err, data);
    });
  }

  set(sid: string, data: SessionData, callback?: Callback): void {
    this.forget(sid);
    const began = this.generation;
    this.inner.set(sid, data, (err?: unknown) => {
      if (!err && began === this.generation) this.fresh.set(sid, JSON.stringify(data));
      callback?.(err);
    });
  }

  destroy(sid: string, callback?: Callback): void {
    this.forget(sid);
    this.inner.destroy(sid, (err?: unknown) => {
      // A read that began while the row was still there must not bring it back.
      this.forget(sid);
      callback?.(err);
    });
  }

  // Called on every request that left the session unchanged: the store only moves the row's
  // expiry (ours not even that, its touch is off), so the cached data stay as they are.
  override touch(sid: string, data: SessionData, callback?: Callback): void {
    if (this.inner.touch) this.inner.touch(sid, data, (err?: unknown) => callback?.(err));
    else callback?.();
  }

  private forget(sid: string): void {
    this.generation++;
    this.fresh.delete(sid);
  }
}
