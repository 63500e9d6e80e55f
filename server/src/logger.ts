import { pino, type DestinationStream, type Logger } from 'pino';

export type { Logger };

/** `destination`: where the lines go; standard output (written synchronously, pino's default) when absent. */
export function createLogger(level: string, name = 'laminote', destination?: DestinationStream): Logger {
  const options = { name, level, redact: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-xsrf-token"]'] };
  return destination ? pino(options, destination) : pino(options);
}
