/**
 * The signed-in user as a request reads it (passport's deserialisation), kept in-process for
 * a couple of seconds, so a client sending many requests a second (the value knob, a plot
 * being dragged, the bench's analyses) costs one user query every few seconds instead of one
 * per request. A hit is merged into the request's entity manager as a managed entity, as if
 * just loaded: a route that changes it and flushes writes only what it changed.
 *
 * Nothing may stay stale: every flush that changes a user or a membership forgets every
 * kept user (when the flush commits, and again when the transaction around it commits;
 * while such a transaction is open, nothing is kept), and whatever ends sessions in SQL
 * (`forgetCachedSessions`) forgets them too. Within the process a read that began before a
 * change never fills the cache (generation check). Only this server changes accounts while
 * it runs; a change made by another process is seen within `USER_CACHE_MS`.
 */
import type {
  EntityManager as CoreEntityManager,
  EventSubscriber,
  FlushEventArgs,
  TransactionEventArgs,
  UnitOfWork,
} from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import { LRUCache } from 'lru-cache';
import { UserSchema, type User } from '../users/user.entity';

/** How long a user read stays fresh, ms. */
export const USER_CACHE_MS = 2000;
/** Users kept at most (the least recently used go first). */
const MAX_ENTRIES = 10_000;
/** Entities whose change forgets every kept user. */
const WATCHED = new Set(['User', 'Membership']);

type UserData = Record<string, unknown>;

const kept = new LRUCache<string, UserData>({ max: MAX_ENTRIES, ttl: USER_CACHE_MS });
/** Bumped by every forget: a read begun before one does not fill the cache. */
let generation = 0;
/** Open transactions that changed a user or a membership; nothing is kept while any is. */
const changing = new WeakSet<CoreEntityManager>();
let changingCount = 0;

/** Forgets every kept user (after users, memberships or sessions changed). */
export function forgetCachedUsers(): void {
  generation++;
  kept.clear();
}

/** The user's column values, dates copied (the cached copy is never handed out). */
function snapshot(em: EntityManager, user: User): UserData {
  const data: UserData = {};
  for (const prop of em.getMetadata().get(UserSchema.meta.className).props) {
    if (prop.kind !== 'scalar') continue;
    const value = (user as unknown as UserData)[prop.name];
    data[prop.name] = value instanceof Date ? new Date(value) : value;
  }
  return data;
}

/** `snapshot` copied again for one request (its dates are its own to change). */
function copy(data: UserData): UserData {
  const out: UserData = {};
  for (const key in data) {
    const value = data[key];
    out[key] = value instanceof Date ? new Date(value) : value;
  }
  return out;
}

/**
 * The user `id` in `em`'s request context: from the cache when fresh, else from the
 * database (null when there is no such user).
 */
export async function findUser(em: EntityManager, id: string): Promise<User | null> {
  const hit = kept.get(id);
  if (hit) return em.merge(UserSchema, copy(hit), { validate: false });
  const began = generation;
  const user = await em.findOne(UserSchema, { id });
  if (user && began === generation && changingCount === 0) kept.set(id, snapshot(em, user));
  return user;
}

function touchesWatched(uow: UnitOfWork): boolean {
  for (const change of uow.getChangeSets()) if (WATCHED.has(change.rootName)) return true;
  return false;
}

/**
 * Forgets the kept users on every flush that changes a user or a membership: as it starts
 * (so no later request reads the old user from memory), as it commits, and, in an explicit
 * transaction, when that commits or rolls back.
 */
export class UserCacheSubscriber implements EventSubscriber {
  onFlush(args: FlushEventArgs): void {
    if (!touchesWatched(args.uow)) return;
    forgetCachedUsers();
    if (args.em.isInTransaction() && !changing.has(args.em)) {
      changing.add(args.em);
      changingCount++;
    }
  }

  afterFlush(args: FlushEventArgs): void {
    if (touchesWatched(args.uow)) forgetCachedUsers();
  }

  afterTransactionCommit(args: TransactionEventArgs): void {
    this.ended(args.em);
  }

  afterTransactionRollback(args: TransactionEventArgs): void {
    this.ended(args.em);
  }

  private ended(em: CoreEntityManager): void {
    if (!changing.delete(em)) return;
    changingCount--;
    forgetCachedUsers();
  }
}
