/**
 * Short in-memory caches in front of the two rows every signed-in request reads: its session and its
 * user. Without them each request costs two queries before any work of its own (issue 15).
 *
 * Both are kept for a few seconds only, so a change made outside this process (a site-admin flag set
 * by the seed or by hand in the database) is seen within that time; every change this process makes
 * forgets the entry at once: sign-out and session regeneration (the store's destroy), a session write
 * (its set), and a sign-in that updates the person (forgetSessionUser).
 */
import type session from 'express-session';
import type { Db } from '../db/client';
import type { SessionUser } from './types';

export const SESSION_CACHE_MS = 5_000;
const MAX_ENTRIES = 10_000;

/** Entries that expire `ttlMs` after they were stored; the oldest go first when it is full. */
export class ExpiringCache<V> {
  private readonly entries = new Map<string, { value: V; until: number }>();

  constructor(
    private readonly ttlMs: number,
    private readonly maxEntries = MAX_ENTRIES,
  ) {}

  get(key: string, now = Date.now()): V | undefined {
    const hit = this.entries.get(key);
    if (!hit) return undefined;
    if (hit.until <= now) {
      this.entries.delete(key);
      return undefined;
    }
    return hit.value;
  }

  set(key: string, value: V, until = Date.now() + this.ttlMs): void {
    this.entries.delete(key);
    if (this.entries.size >= this.maxEntries) this.entries.delete(this.entries.keys().next().value!);
    this.entries.set(key, { value, until: Math.min(until, Date.now() + this.ttlMs) });
  }

  delete(key: string): void {
    this.entries.delete(key);
  }
}

type Callback = (err?: unknown) => void;
/** The part of an express-session store this wraps (connect-pg-simple's PGStore). */
interface StoreMethods {
  get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void;
  set(sid: string, data: session.SessionData, callback?: Callback): void;
  destroy(sid: string, callback?: Callback): void;
}
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- a store's constructor takes its own options
type StoreClass = new (...args: any[]) => StoreMethods;

/**
 * The session store `Base` with reads answered from memory for SESSION_CACHE_MS. A hit hands out a
 * fresh copy (express-session changes the object it is given). Writes and destroys go to the store
 * and forget the entry first, so a signed-out session is never answered from memory.
 */
export function cachedSessionStore<T extends StoreClass>(Base: T): T {
  class CachedStore extends (Base as StoreClass) {
    private readonly recent = new ExpiringCache<string>(SESSION_CACHE_MS);

    override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
      const hit = this.recent.get(sid);
      if (hit !== undefined) {
        const copy = JSON.parse(hit) as session.SessionData;
        process.nextTick(() => callback(null, copy));
        return;
      }
      super.get(sid, (err: unknown, data?: session.SessionData | null) => {
        if (!err && data) {
          const expires = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Infinity;
          this.recent.set(sid, JSON.stringify(data), expires);
        }
        callback(err, data);
      });
    }

    override set(sid: string, data: session.SessionData, callback?: Callback): void {
      this.recent.delete(sid);
      super.set(sid, data, callback);
    }

    override destroy(sid: string, callback?: Callback): void {
      this.recent.delete(sid);
      super.destroy(sid, callback);
    }
  }
  return CachedStore as unknown as T;
}

/** Signed-in people by id, one cache per database (one per app). */
const users = new WeakMap<Db, ExpiringCache<SessionUser>>();

export function sessionUserCache(db: Db): ExpiringCache<SessionUser> {
  let cache = users.get(db);
  if (!cache) {
    cache = new ExpiringCache<SessionUser>(SESSION_CACHE_MS);
    users.set(db, cache);
  }
  return cache;
}

/** Call after changing a person's row (name, e-mail, site-admin flag), so the next request reads it. */
export function forgetSessionUser(db: Db, userId: string): void {
  users.get(db)?.delete(userId);
}
