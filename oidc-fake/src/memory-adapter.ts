import type { Adapter, AdapterPayload } from 'oidc-provider';

/**
 * In-memory storage for the provider's sessions, grants, codes and tokens. A development fake loses
 * them on restart on purpose: the app signs in again, and nothing needs a database. Each provider
 * instance gets a store of its own, so tests that start several providers never share sessions.
 */
interface Entry {
  payload: AdapterPayload;
  expiresAt: number;
}

export function createMemoryAdapterFactory(now: () => number = Date.now): (modelName: string) => Adapter {
  const entries = new Map<string, Entry>();
  const sessionIdByUid = new Map<string, string>();
  const userCodeIndex = new Map<string, string>();
  const keysByGrant = new Map<string, Set<string>>();

  let writesSinceSweep = 0;

  // Expired entries go on the next read; a periodic sweep keeps a long-running fake from growing.
  const sweep = () => {
    const at = now();
    for (const [key, entry] of entries) {
      if (entry.expiresAt <= at) {
        entries.delete(key);
      }
    }
  };

  const live = (key: string): Entry | undefined => {
    const entry = entries.get(key);
    if (entry && entry.expiresAt <= now()) {
      entries.delete(key);
      return undefined;
    }
    return entry;
  };

  return (modelName) => {
    const keyFor = (id: string) => `${modelName}:${id}`;
    return {
      async upsert(id, payload, expiresIn) {
        if (++writesSinceSweep >= 256) {
          writesSinceSweep = 0;
          sweep();
        }
        const key = keyFor(id);
        const expiresAt = typeof expiresIn === 'number' ? now() + expiresIn * 1000 : Number.POSITIVE_INFINITY;
        entries.set(key, { payload, expiresAt });
        if (modelName === 'Session' && payload.uid) {
          sessionIdByUid.set(payload.uid, id);
        }
        if (payload.userCode) {
          userCodeIndex.set(payload.userCode, id);
        }
        if (payload.grantId) {
          const members = keysByGrant.get(payload.grantId) ?? new Set<string>();
          members.add(key);
          keysByGrant.set(payload.grantId, members);
        }
      },
      async find(id) {
        return live(keyFor(id))?.payload;
      },
      async findByUid(uid) {
        const id = sessionIdByUid.get(uid);
        return id === undefined ? undefined : live(keyFor(id))?.payload;
      },
      async findByUserCode(userCode) {
        const id = userCodeIndex.get(userCode);
        return id === undefined ? undefined : live(keyFor(id))?.payload;
      },
      async consume(id) {
        const entry = live(keyFor(id));
        if (entry) {
          entry.payload.consumed = Math.floor(now() / 1000);
        }
      },
      async destroy(id) {
        const key = keyFor(id);
        const entry = entries.get(key);
        entries.delete(key);
        if (entry?.payload.uid && sessionIdByUid.get(entry.payload.uid) === id) {
          sessionIdByUid.delete(entry.payload.uid);
        }
        if (entry?.payload.grantId) {
          keysByGrant.get(entry.payload.grantId)?.delete(key);
        }
      },
      async revokeByGrantId(grantId) {
        for (const key of keysByGrant.get(grantId) ?? []) {
          entries.delete(key);
        }
        keysByGrant.delete(grantId);
      },
    };
  };
}
