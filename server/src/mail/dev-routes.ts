import { Router } from 'express';
import { sinkMessageSchema } from '@laminote/contracts';
import type { Config } from '../config';
import { notFound, ProblemError } from '../http/problem';

/**
 * GET /api/dev/mail: what the development mail sink received, for site admins, outside production
 * only. In production the route does not exist (404), whatever the caller.
 */
export function devMailRouter({ config }: { config: Pick<Config, 'NODE_ENV' | 'SMTP_HOST' | 'SMTP_SINK_HTTP_PORT'> }): Router {
  const router = Router();
  if (config.NODE_ENV === 'production') return router;
  const sink = `http://${config.SMTP_HOST}:${config.SMTP_SINK_HTTP_PORT}/messages`;

  router.get('/dev/mail', async (req, res) => {
    if (!req.user!.siteAdmin) throw notFound('page');
    let body: unknown;
    try {
      const answer = await fetch(sink, { signal: AbortSignal.timeout(5000) });
      if (!answer.ok) throw new Error(`the sink answered ${answer.status}`);
      body = await answer.json();
    } catch (err) {
      throw new ProblemError(502, 'mail-sink-unavailable', 'The development mail sink cannot be reached', {
        detail: `Nothing answered at ${sink} (${err instanceof Error ? err.message : String(err)}). \`npm start\` runs the sink; or start it with \`npx tsx server/src/mail/sink-main.ts\`.`,
      });
    }
    const parsed = sinkMessageSchema.array().safeParse(body);
    if (!parsed.success) throw new ProblemError(502, 'mail-sink-unavailable', 'The development mail sink answered something unexpected');
    res.json(parsed.data);
  });

  return router;
}
