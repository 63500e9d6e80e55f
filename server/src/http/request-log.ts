import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pinoHttp } from 'pino-http';
import type { Logger } from '../logger';

/**
 * One log line per request (pino-http): its id (the caller's X-Request-Id, or a new one, sent back),
 * method, address, status and time, at the logger's level; `req.log` names the request in every line
 * a handler writes. Only those fields are logged, never headers (cookies, tokens). pino-http's usual
 * wrapping of the serializers is off: it copies every request's headers into an object only for ours
 * to pick three fields from it, on every request, logged or not (issue 15).
 */
export function requestLog(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: (req, res) => {
      const id = (req.headers['x-request-id'] as string | undefined) ?? randomUUID();
      res.setHeader('x-request-id', id);
      return id;
    },
    autoLogging: { ignore: (req) => req.url === '/healthz' },
    wrapSerializers: false,
    serializers: {
      // The address as the request came; routers strip their mount path from req.url further in.
      req: (req: IncomingMessage & { id: unknown; originalUrl?: string }) => ({ id: req.id, method: req.method, url: req.originalUrl ?? req.url }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
    },
  });
}
