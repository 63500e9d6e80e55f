import { z } from 'zod';

/** Configuration from environment variables, read and validated once at start. */
const port = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);

const configSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    HOST: z.string().default('127.0.0.1'),
    PORT: port(4200),
    /** The address people reach the app at; redirect URIs and mail links are built from it. */
    PUBLIC_URL: z.string().url().optional(),
    DATABASE_URL: z.string().url({ message: 'DATABASE_URL must be a postgres:// URL' }),
    OIDC_ISSUER: z.string().url().default('http://127.0.0.1:4400'),
    OIDC_CLIENT_ID: z.string().min(1).default('laminote-web'),
    OIDC_CLIENT_SECRET: z.string().min(1).default('laminote-dev-secret'),
    OIDC_SCOPES: z.string().default('openid email profile'),
    SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').default('laminote-development-session-secret'),
    SESSION_TTL_HOURS: z.coerce.number().positive().default(12),
    /** Folder of the built Angular app; served from the same origin as the API when present. */
    WEB_DIST: z.string().default('dist/web/browser'),
    SMTP_HOST: z.string().default('127.0.0.1'),
    SMTP_PORT: port(2525),
    MAIL_FROM: z.string().default('Laminote <laminote@tamsk.example>'),
    /** The development mail sink's HTTP API (what it received), read by the site admins' mail page outside production. */
    SMTP_SINK_HTTP_PORT: port(2526),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    /** Engine worker threads; 0 picks from the number of cores. */
    ENGINE_THREADS: z.coerce.number().int().min(0).max(64).default(0),
    /** Requests a minute that one personal API token may make. */
    API_TOKEN_RATE_PER_MINUTE: z.coerce.number().int().min(1).max(100_000).default(300),
  })
  .transform((env) => ({ ...env, PUBLIC_URL: (env.PUBLIC_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, '') }))
  .superRefine((env, ctx) => {
    if (env.NODE_ENV === 'production' && env.SESSION_SECRET === 'laminote-development-session-secret') {
      ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'SESSION_SECRET must be set in production' });
    }
  });

export type Config = z.infer<typeof configSchema>;

export class ConfigError extends Error {}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.') || 'environment'}: ${i.message}`);
    throw new ConfigError(`Invalid configuration:\n  ${lines.join('\n  ')}`);
  }
  return parsed.data;
}
