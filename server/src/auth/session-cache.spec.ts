import type session from 'express-session';
import { describe, expect, it, vi } from 'vitest';
import { cachedSessionStore, ExpiringCache, SESSION_CACHE_MS } from './session-cache';

/** A store that keeps sessions in a map and counts its reads, as the database behind it would. */
class CountingStore {
  readonly rows = new Map<string, string>();
  reads = 0;
  get(sid: string, callback: (err: unknown, data?: session.SessionData | null) => void): void {
    this.reads++;
    const row = this.rows.get(sid);
    setImmediate(() => callback(null, row === undefined ? null : (JSON.parse(row) as session.SessionData)));
  }
  set(sid: string, data: session.SessionData, callback?: (err?: unknown) => void): void {
    this.rows.set(sid, JSON.stringify(data));
    setImmediate(() => callback?.());
  }
  destroy(sid: string, callback?: (err?: unknown) => void): void {
    this.rows.delete(sid);
    setImmediate(() => callback?.());
  }
}

const Cached = cachedSessionStore(CountingStore);
const read = (store: InstanceType<typeof Cached>, sid: string) =>
  new Promise<session.SessionData | null | undefined>((resolve, reject) => store.get(sid, (err, data) => (err ? reject(err) : resolve(data))));
const call = (f: (cb: (err?: unknown) => void) => void) => new Promise<void>((resolve, reject) => f((err) => (err ? reject(err) : resolve())));
const data = (userId: string) => ({ cookie: { originalMaxAge: 3600_000, expires: new Date(Date.now() + 3600_000) }, userId }) as unknown as session.SessionData;

describe('cachedSessionStore', () => {
  it('answers a second read from memory, each time with a copy of its own', async () => {
    const store = new Cached();
    await call((cb) => store.set('s1', data('u1'), cb));
    const first = await read(store, 's1');
    const second = await read(store, 's1');
    expect(store.reads).toBe(1);
    expect(second).toEqual(first);
    expect(second).not.toBe(first);
    (second as { userId: string }).userId = 'changed by a request';
    expect(((await read(store, 's1')) as { userId: string }).userId).toBe('u1');
  });

  it('never answers a signed-out (destroyed) session from memory', async () => {
    const store = new Cached();
    await call((cb) => store.set('s1', data('u1'), cb));
    await read(store, 's1');
    await call((cb) => store.destroy('s1', cb));
    expect(await read(store, 's1')).toBeNull();
  });

  it('reads a session again after it was written', async () => {
    const store = new Cached();
    await call((cb) => store.set('s1', data('u1'), cb));
    await read(store, 's1');
    await call((cb) => store.set('s1', data('u2'), cb));
    expect(((await read(store, 's1')) as { userId: string }).userId).toBe('u2');
    expect(store.reads).toBe(2);
  });

  it('does not remember a session that is not there', async () => {
    const store = new Cached();
    expect(await read(store, 'nobody')).toBeNull();
    await call((cb) => store.set('nobody', data('u3'), cb));
    expect(((await read(store, 'nobody')) as { userId: string }).userId).toBe('u3');
  });
});

describe('ExpiringCache', () => {
  it('forgets an entry after its time, and never keeps one past the given end', () => {
    vi.useFakeTimers();
    try {
      const cache = new ExpiringCache<string>(SESSION_CACHE_MS);
      cache.set('a', 'x');
      cache.set('b', 'y', Date.now() + 100);
      vi.advanceTimersByTime(101);
      expect(cache.get('a')).toBe('x');
      expect(cache.get('b')).toBeUndefined();
      vi.advanceTimersByTime(SESSION_CACHE_MS);
      expect(cache.get('a')).toBeUndefined();
    } finally {
      vi.useRealTimers();
    }
  });

  it('drops the oldest entry when full', () => {
    const cache = new ExpiringCache<number>(60_000, 2);
    cache.set('a', 1);
    cache.set('b', 2);
    cache.set('c', 3);
    expect([cache.get('a'), cache.get('b'), cache.get('c')]).toEqual([undefined, 2, 3]);
  });
});
