import { z } from 'zod';

/** Configuration from environment variables, read and validated once at start. */
/** Built-in secrets for development and tests only; production refuses to start with them. */
const DEV_SESSION_SECRET = 'laminote-development-session-secret';
const DEV_OIDC_CLIENT_SECRET = 'laminote-dev-secret';
const isLoopbackHost = (host: string) => host === 'localhost' || host === '::1' || host.startsWith('127.');

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
    OIDC_CLIENT_SECRET: z.string().min(1).default(DEV_OIDC_CLIENT_SECRET),
    OIDC_SCOPES: z.string().default('openid email profile'),
    SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').default(DEV_SESSION_SECRET),
    SESSION_TTL_HOURS: z.coerce.number().positive().default(12),
    /** Folder of the built Angular app; served from the same origin as the API when present. */
    WEB_DIST: z.string().default('dist/web/browser'),
    SMTP_HOST: z.string().default('127.0.0.1'),
    SMTP_PORT: port(2525),
    /** Sign-in to the mail server, when it asks for one. */
    SMTP_USER: z.string().min(1).optional(),
    SMTP_PASSWORD: z.string().min(1).optional(),
    /** `tls` (port 465), `starttls` (required; port 587) or `none` (the loopback development sink only). */
    SMTP_SECURITY: z.enum(['tls', 'starttls', 'none']).default('none'),
    MAIL_FROM: z.string().default('Laminote <laminote@tamsk.example>'),
    /** Sign-in attempts (GET /auth/login, /auth/callback) a minute from one client address. */
    SIGN_IN_RATE_PER_MINUTE: z.coerce.number().int().min(1).max(100_000).default(30),
    /** The development mail sink's HTTP API (what it received), read by the site admins' mail page outside production. */
    SMTP_SINK_HTTP_PORT: port(2526),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    /** Engine worker threads; 0 picks from the number of cores. */
    ENGINE_THREADS: z.coerce.number().int().min(0).max(64).default(0),
    /** Requests a minute that one personal API token may make. */
    API_TOKEN_RATE_PER_MINUTE: z.coerce.number().int().min(1).max(100_000).default(300),
    /** A piece of job work not acknowledged within this many seconds is handed to another worker (its worker died). */
    JOB_EXPIRE_SECONDS: z.coerce.number().int().min(5).max(3600).default(60),
    /** How often workers look for such lost pieces. */
    JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(600).default(10),
    /** Outputs that no draft or version refers to are pruned once older than this; finished jobs and sweep cases too. */
    RETENTION_OUTPUT_DAYS: z.coerce.number().min(0).default(30),
    /** Sent mail is pruned from the outbox once older than this. */
    RETENTION_MAIL_DAYS: z.coerce.number().min(0).default(14),
    /** When the clean-up runs (cron, server time). */
    RETENTION_CRON: z.string().default('17 3 * * *'),
  })
  .transform((env) => ({ ...env, PUBLIC_URL: (env.PUBLIC_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, '') }))
  .superRefine((env, ctx) => {
    // Outside development and tests, the built-in secrets are public knowledge (they are in this file).
    if (env.NODE_ENV === 'production') {
      if (env.SESSION_SECRET === DEV_SESSION_SECRET) ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'SESSION_SECRET must be set in production (a long random value)' });
      if (env.OIDC_CLIENT_SECRET === DEV_OIDC_CLIENT_SECRET) {
        ctx.addIssue({ code: 'custom', path: ['OIDC_CLIENT_SECRET'], message: 'OIDC_CLIENT_SECRET must be set in production (the secret your identity provider gave the app)' });
      }
      if (env.SMTP_SECURITY === 'none' && !isLoopbackHost(env.SMTP_HOST)) {
        ctx.addIssue({ code: 'custom', path: ['SMTP_SECURITY'], message: 'SMTP_SECURITY must be tls or starttls for a mail server beyond this machine' });
      }
      if ((env.SMTP_USER === undefined) !== (env.SMTP_PASSWORD === undefined)) {
        ctx.addIssue({ code: 'custom', path: ['SMTP_PASSWORD'], message: 'give SMTP_USER and SMTP_PASSWORD together' });
      }
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

/** For a process's entry point: the configuration, or the message on standard error and exit status 2. */
export function loadConfigOrExit(env: NodeJS.ProcessEnv = process.env): Config {
  try {
    return loadConfig(env);
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`${err.message}\n`);
      process.exit(2);
    }
    throw err;
  }
}
