import { MemoryStore, type SessionData } from 'express-session';
import { CachedSessionStore, forgetCachedSessions } from './session-cache';

/** express-session's own memory store, counting the reads that reach it. */
class CountingStore extends MemoryStore {
  reads = 0;
  /** When set, reads wait for this before answering (a slow database). */
  gate: Promise<void> | null = null;
  override get(sid: string, cb: (err: unknown, s?: SessionData | null) => void): void {
    this.reads++;
    const read = () => super.get(sid, cb);
    if (this.gate) void this.gate.then(read);
    else read();
  }
}

const data = (user: string): SessionData =>
  ({ cookie: { originalMaxAge: 1000, expires: new Date(Date.now() + 1000) }, passport: { user } }) as unknown as SessionData; // prettier-ignore

const get = (store: CachedSessionStore, sid: string) =>
  new Promise<SessionData | null | undefined>((resolve, reject) =>
    store.get(sid, (err, s) => (err ? reject(err) : resolve(s))),
  );
const set = (store: CachedSessionStore, sid: string, s: SessionData) =>
  new Promise<void>((resolve, reject) =>
    store.set(sid, s, (err) => (err ? reject(err) : resolve())),
  );
const destroy = (store: CachedSessionStore, sid: string) =>
  new Promise<void>((resolve, reject) =>
    store.destroy(sid, (err) => (err ? reject(err) : resolve())),
  );
const userOf = (s: SessionData | null | undefined) =>
  (s as unknown as { passport?: { user: string } } | null | undefined)?.passport?.user;

describe('the session read cache', () => {
  it('should read the store once for repeated reads within its time, each reader getting its own copy', async () => {
    const inner = new CountingStore();
    const store = new CachedSessionStore(inner, 60_000);
    await set(store, 's1', data('ada'));
    const first = await get(store, 's1');
    const second = await get(store, 's1');
    expect(userOf(first)).toBe('ada');
    expect(userOf(second)).toBe('ada');
    expect(first).not.toBe(second);
    // The write filled the cache: no read reached the store.
    expect(inner.reads).toBe(0);
  });

  it('should read the store again once the cached read is older than its time', async () => {
    const inner = new CountingStore();
    const store = new CachedSessionStore(inner, 30);
    await set(store, 's1', data('ada'));
    await get(store, 's1');
    await new Promise((r) => setTimeout(r, 60));
    expect(userOf(await get(store, 's1'))).toBe('ada');
    expect(inner.reads).toBe(1);
  });

  it('should not answer from the cache for a session ended through the store or in SQL', async () => {
    const inner = new CountingStore();
    const store = new CachedSessionStore(inner, 60_000);
    await set(store, 's1', data('ada'));
    await set(store, 's2', data('bob'));
    await destroy(store, 's1');
    expect(await get(store, 's1')).toBeFalsy();
    // Ended behind the store's back (as a password change does), then announced.
    inner.destroy('s2');
    expect(userOf(await get(store, 's2'))).toBe('bob');
    forgetCachedSessions();
    expect(await get(store, 's2')).toBeFalsy();
  });

  it('should not let a read that began before an end put the ended session back', async () => {
    const inner = new CountingStore();
    const store = new CachedSessionStore(inner, 60_000);
    inner.set('s1', data('ada'));
    let open!: () => void;
    inner.gate = new Promise((r) => (open = r));
    const slow = get(store, 's1');
    // The row is deleted in SQL and announced while the read is on its way; the read
    // itself was answered with the row as it was.
    inner.destroy('s1');
    forgetCachedSessions();
    inner.set('s1', data('ada'));
    open();
    expect(userOf(await slow)).toBe('ada');
    inner.gate = null;
    inner.destroy('s1');
    expect(await get(store, 's1')).toBeFalsy();
  });
});
