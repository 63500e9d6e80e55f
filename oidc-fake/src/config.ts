import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import { z } from 'zod';

/** The repository's `.data/` folder (ignored by git), where PostgreSQL and the provider keep state. */
export const DEFAULT_DATA_DIR = fileURLToPath(new URL('../../.data', import.meta.url));

const port = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);

const webUrl = z.url({ protocol: /^https?$/, message: 'must be an absolute http(s) URL' });

/** A comma-separated list of absolute http(s) URLs, as the redirect-URI variables carry them. */
const urlList = (fallback: string) =>
  z
    .string()
    .default(fallback)
    .transform((raw) => raw.split(',').map((part) => part.trim()).filter((part) => part.length > 0))
    .pipe(z.array(webUrl).min(1, 'must list at least one URL'));

const environmentSchema = z
  .object({
    OIDC_PORT: port(4400),
    OIDC_HOST: z.string().min(1).default('127.0.0.1'),
    OIDC_ISSUER: webUrl.optional(),
    DATA_DIR: z.string().min(1).optional(),
    OIDC_CLIENT_ID: z.string().min(1).default('laminote-web'),
    OIDC_CLIENT_SECRET: z.string().min(1).default('laminote-dev-secret'),
    OIDC_REDIRECT_URIS: urlList('http://127.0.0.1:4200/auth/callback'),
    OIDC_POST_LOGOUT_URIS: urlList('http://127.0.0.1:4200/'),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  })
  .transform((env) => ({
    port: env.OIDC_PORT,
    host: env.OIDC_HOST,
    issuer: env.OIDC_ISSUER ?? `http://127.0.0.1:${env.OIDC_PORT}`,
    dataDir: env.DATA_DIR === undefined ? DEFAULT_DATA_DIR : resolve(env.DATA_DIR),
    client: {
      clientId: env.OIDC_CLIENT_ID,
      clientSecret: env.OIDC_CLIENT_SECRET,
      redirectUris: env.OIDC_REDIRECT_URIS,
      postLogoutRedirectUris: env.OIDC_POST_LOGOUT_URIS,
    },
    logLevel: env.LOG_LEVEL,
  }));

export type IdentityProviderEnvironment = z.infer<typeof environmentSchema>;
export type ClientSettings = IdentityProviderEnvironment['client'];

export class ConfigError extends Error {}

/** Reads and validates the provider's environment variables; a bad value names the variable at fault. */
export function readEnvironment(env: NodeJS.ProcessEnv = process.env): IdentityProviderEnvironment {
  const parsed = environmentSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'environment'}: ${issue.message}`);
    throw new ConfigError(`Invalid identity-provider configuration:\n  ${lines.join('\n  ')}`);
  }
  return parsed.data;
}
