import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { loadOrCreateKeys } from '../src/keys';
import { startProvider, temporaryDataDir } from './browser';

interface PublicJwks {
  keys: { kid: string; n: string; e: string }[];
}

async function servedKeys(dataDir: string): Promise<PublicJwks> {
  const running = await startProvider(dataDir);
  try {
    return (await (await fetch(`${running.issuer}/jwks`)).json()) as PublicJwks;
  } finally {
    await running.stop();
  }
}

const cleanups: (() => void)[] = [];
afterEach(() => {
  cleanups.splice(0).forEach((remove) => remove());
});

function freshDir(): string {
  const dir = temporaryDataDir();
  cleanups.push(dir.remove);
  return dir.path;
}

describe('signing keys', () => {
  it('are generated at first start under <dataDir>/oidc and reused by the next provider', async () => {
    const dataDir = freshDir();
    const first = await servedKeys(dataDir);
    const file = join(dataDir, 'oidc', 'jwks.json');
    expect(statSync(file).mode & 0o077).toBe(0);

    const second = await servedKeys(dataDir);
    expect(second.keys).toEqual(first.keys);
    expect(first.keys[0]?.kid).toBeTruthy();

    // A provider with another data directory gets keys of its own: the reuse above is not a constant.
    const elsewhere = await servedKeys(freshDir());
    expect(elsewhere.keys[0]?.kid).not.toBe(first.keys[0]?.kid);
    expect(elsewhere.keys[0]?.n).not.toBe(first.keys[0]?.n);
  });

  it('keep the cookie keys alongside, so browser sessions survive a restart', () => {
    const dataDir = freshDir();
    const first = loadOrCreateKeys(dataDir);
    const second = loadOrCreateKeys(dataDir);
    expect(second.cookieKeys).toEqual(first.cookieKeys);
    expect(first.cookieKeys[0]?.length).toBeGreaterThanOrEqual(32);
    const stored = JSON.parse(readFileSync(join(dataDir, 'oidc', 'cookie-keys.json'), 'utf8')) as { keys: string[] };
    expect(stored.keys).toEqual(first.cookieKeys);
  });

  it('refuse a damaged key file with a message naming it, instead of silently replacing it', () => {
    const dataDir = freshDir();
    loadOrCreateKeys(dataDir);
    const file = join(dataDir, 'oidc', 'jwks.json');

    writeFileSync(file, '{"keys": [');
    expect(() => loadOrCreateKeys(dataDir)).toThrow(`${file} is not valid JSON`);

    writeFileSync(file, JSON.stringify({ keys: [{ kty: 'RSA', kid: 'k', alg: 'RS256', use: 'sig', n: 'x', e: 'AQAB' }] }));
    expect(() => loadOrCreateKeys(dataDir)).toThrow(/jwks\.json does not hold the keys the identity provider expects at keys\.0\.d/);
  });
});
