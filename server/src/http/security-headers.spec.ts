import express from 'express';
import helmet, { type HelmetOptions } from 'helmet';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { securityHeaders } from './security-headers';

const answer = async (headers: express.RequestHandler) => {
  const app = express();
  app.use(headers);
  app.get('/x', (_req, res) => {
    res.json({ ok: true });
  });
  const res = await request(app).get('/x').expect(200);
  // The date and the body's own headers are the same either way; only helmet's are compared.
  const { date: _date, etag: _etag, ...rest } = res.headers;
  return rest;
};

const appOptions = (hsts: boolean): HelmetOptions => ({
  contentSecurityPolicy: {
    useDefaults: false,
    directives: { defaultSrc: ["'self'"], scriptSrc: ["'self'"], styleSrc: ["'self'", "'unsafe-inline'"], objectSrc: ["'none'"], frameAncestors: ["'none'"] },
  },
  crossOriginOpenerPolicy: { policy: 'same-origin' },
  strictTransportSecurity: hsts,
});

describe('securityHeaders', () => {
  for (const options of [appOptions(false), appOptions(true), {}]) {
    it(`sets exactly the headers helmet sets (${JSON.stringify(options).slice(0, 60)}…)`, async () => {
      const fromHelmet = await answer(helmet(options));
      expect(fromHelmet['content-security-policy']).toBeTruthy();
      expect(await answer(securityHeaders(options))).toEqual(fromHelmet);
    });
  }

  it('takes away X-Powered-By as helmet does', async () => {
    const app = express();
    app.use(securityHeaders({}));
    app.get('/x', (_req, res) => {
      res.send('ok');
    });
    const res = await request(app).get('/x');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('refuses options computed per request (a CSP nonce), whose headers are not fixed', () => {
    expect(() => securityHeaders({ contentSecurityPolicy: { directives: { scriptSrc: ["'self'", () => "'nonce-x'"] } } })).toThrow(/function/);
  });
});
