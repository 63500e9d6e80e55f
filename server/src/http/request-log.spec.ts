import { Writable } from 'node:stream';
import express from 'express';
import { pino } from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { requestLog } from './request-log';

/** An app with the request log, its lines collected as parsed JSON. */
function loggedApp() {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const line of chunk.toString().split('\n')) if (line) lines.push(JSON.parse(line) as Record<string, unknown>);
      done();
    },
  });
  const logger = pino({ level: 'info' }, sink);
  const app = express();
  app.use(requestLog(logger));
  const inner = express.Router();
  inner.get('/item', (req, res) => {
    req.log.info({ note: 'in the handler' }, 'handler line');
    res.status(201).json({ ok: true });
  });
  inner.get('/fail', () => {
    throw new Error('broken');
  });
  app.use('/api', inner);
  app.get('/healthz', (_req, res) => {
    res.json({ status: 'ok' });
  });
  app.use((_err: unknown, _req: express.Request, res: express.Response, _next: express.NextFunction) => {
    res.status(500).json({ failed: true });
  });
  return { app, lines };
}

describe('requestLog', () => {
  it('logs one line a request with its id, method, whole address, status and time, and no headers', async () => {
    const { app, lines } = loggedApp();
    const res = await request(app).get('/api/item?x=1').set('x-request-id', 'abc-123').set('cookie', 'laminote.sid=secret').expect(201);
    expect(res.headers['x-request-id']).toBe('abc-123');
    const done = lines.find((l) => l['msg'] === 'request completed')!;
    expect(done).toMatchObject({ req: { id: 'abc-123', method: 'GET', url: '/api/item?x=1' }, res: { statusCode: 201 } });
    expect(typeof done['responseTime']).toBe('number');
    expect(JSON.stringify(lines)).not.toContain('secret');
    // A handler's own line names the request too.
    expect(lines.find((l) => l['msg'] === 'handler line')).toMatchObject({ note: 'in the handler', req: { id: 'abc-123', url: '/api/item?x=1' } });
  });

  it('makes an id when the caller sends none, logs a failure with its error, and leaves /healthz out', async () => {
    const { app, lines } = loggedApp();
    const res = await request(app).get('/api/fail').expect(500);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(lines.find((l) => l['msg'] === 'request errored')).toMatchObject({
      req: { id: res.headers['x-request-id'], url: '/api/fail' },
      res: { statusCode: 500 },
      err: { type: 'Error', message: 'failed with status code 500' },
    });
    await request(app).get('/healthz').expect(200);
    expect(lines.some((l) => (l['req'] as { url?: string } | undefined)?.url === '/healthz')).toBe(false);
  });
});
