import { pino, type Logger } from 'pino';

export type { Logger };

export function createLogger(level: string, name = 'laminote'): Logger {
  return pino({ name, level, redact: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-xsrf-token"]'] });
}
