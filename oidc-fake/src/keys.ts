import { generateKeyPairSync, randomBytes, randomUUID } from 'node:crypto';
import { linkSync, mkdirSync, readFileSync, unlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { JsonWebKey } from 'oidc-provider';
import { z } from 'zod';

/**
 * Key material that must outlive a restart: the RS256 signing keys (tokens and sessions issued before
 * a restart stay verifiable) and the cookie-signing keys (browser sessions stay valid). Generated on
 * first start under `<dataDir>/oidc/`, read back on every later start.
 */
export interface ProviderKeys {
  jwks: { keys: JsonWebKey[] };
  cookieKeys: string[];
}

const rsaPrivateJwk = z
  .object({
    kty: z.literal('RSA'),
    kid: z.string().min(1),
    alg: z.literal('RS256'),
    use: z.literal('sig'),
    n: z.string().min(1),
    e: z.string().min(1),
    d: z.string().min(1),
    p: z.string().min(1),
    q: z.string().min(1),
    dp: z.string().min(1),
    dq: z.string().min(1),
    qi: z.string().min(1),
  })
  .strict();
const jwksFile = z.object({ keys: z.array(rsaPrivateJwk).min(1) });
const cookieKeysFile = z.object({ keys: z.array(z.string().min(32)).min(1) });

export function keyDirectory(dataDir: string): string {
  return join(dataDir, 'oidc');
}

export function loadOrCreateKeys(dataDir: string): ProviderKeys {
  const directory = keyDirectory(dataDir);
  mkdirSync(directory, { recursive: true, mode: 0o700 });
  const jwks = loadOrCreate(join(directory, 'jwks.json'), jwksFile, () => ({ keys: [newSigningKey()] }));
  const cookies = loadOrCreate(join(directory, 'cookie-keys.json'), cookieKeysFile, () => ({
    keys: [randomBytes(32).toString('base64url')],
  }));
  return { jwks, cookieKeys: cookies.keys };
}

function newSigningKey(): JsonWebKey {
  const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  const jwk = privateKey.export({ format: 'jwk' });
  return { ...jwk, kty: 'RSA', kid: randomUUID(), alg: 'RS256', use: 'sig' };
}

/**
 * Reads `path`, or creates it with `create()` when it does not exist. A new file is written beside the
 * target and hard-linked into place, which fails if another process got there first; then that
 * process's file wins and is read, so two providers started at once never disagree about their keys.
 */
function loadOrCreate<T>(path: string, schema: z.ZodType<T>, create: () => T): T {
  const existing = readIfPresent(path, schema);
  if (existing !== undefined) {
    return existing;
  }
  const draft = `${path}.${process.pid}.${randomUUID()}.tmp`;
  writeFileSync(draft, `${JSON.stringify(create(), null, 2)}\n`, { mode: 0o600 });
  try {
    linkSync(draft, path);
  } catch (error) {
    if (!isErrorCode(error, 'EEXIST')) {
      throw error;
    }
  } finally {
    unlinkSync(draft);
  }
  const stored = readIfPresent(path, schema);
  if (stored === undefined) {
    throw new Error(`${path} vanished while the identity provider was creating it`);
  }
  return stored;
}

function readIfPresent<T>(path: string, schema: z.ZodType<T>): T | undefined {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    if (isErrorCode(error, 'ENOENT')) {
      return undefined;
    }
    throw error;
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not valid JSON; delete it to let the identity provider generate new keys`);
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue && issue.path.length > 0 ? ` at ${issue.path.join('.')}` : '';
    throw new Error(
      `${path} does not hold the keys the identity provider expects${where}: ${issue?.message ?? 'unreadable'}; ` +
        'delete it to let the provider generate new keys',
    );
  }
  return parsed.data;
}

function isErrorCode(error: unknown, code: string): boolean {
  return error instanceof Error && 'code' in error && error.code === code;
}
