import path from 'node:path';
import { z } from 'zod';
import { createLogger } from '../logger';
import { startSink } from './sink';

/**
 * Runs the development mail sink on its own (the start and test commands run it next to the identity
 * provider): SMTP on SMTP_PORT, its HTTP API on SMTP_SINK_HTTP_PORT, messages kept under DATA_DIR.
 */
const port = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);
const envSchema = z.object({
  SMTP_SINK_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: port(2525),
  SMTP_SINK_HTTP_PORT: port(2526),
  DATA_DIR: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

async function main(): Promise<void> {
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    process.stderr.write(`Invalid configuration for the mail sink:\n  ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('\n  ')}\n`);
    process.exit(2);
  }
  const env = parsed.data;
  const logger = createLogger(env.LOG_LEVEL, 'mail-sink');
  const sink = await startSink({
    host: env.SMTP_SINK_HOST,
    smtpPort: env.SMTP_PORT,
    httpPort: env.SMTP_SINK_HTTP_PORT,
    ...(env.DATA_DIR ? { file: path.join(env.DATA_DIR, 'mail-sink.json') } : {}),
  });
  logger.info({ smtp: `${env.SMTP_SINK_HOST}:${sink.smtpPort}`, http: `http://${env.SMTP_SINK_HOST}:${sink.httpPort}/messages` }, 'mail sink is listening (nothing is delivered)');
  const stop = () => void sink.stop().finally(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  process.stderr.write(`mail sink failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
