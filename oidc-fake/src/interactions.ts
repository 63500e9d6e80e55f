import express, { type ErrorRequestHandler, type Request, type Response, type Router } from 'express';
import Provider, { errors, type InteractionDetails } from 'oidc-provider';
import type { Logger } from 'pino';
import { errorPage, signInPage } from './pages';
import { DEMO_USERS, findDemoUser } from './users';

/**
 * The interaction routes oidc-provider hands the browser to (devInteractions are off): a sign-in page
 * listing the demo users, and a consent step that grants our one registered client what it asked for
 * without a page, since the app and this provider belong to the same product.
 */
export interface InteractionOptions {
  provider: Provider;
  clientId: string;
  clientName: string;
  logger: Logger;
  sendPage: (res: Response, status: number, html: string) => void;
}

export function interactionRoutes({ provider, clientId, clientName, logger, sendPage }: InteractionOptions): Router {
  const router = express.Router();
  const form = express.urlencoded({ extended: false, limit: '4kb', parameterLimit: 10 });

  const details = async (req: Request<{ uid: string }>, res: Response): Promise<InteractionDetails> => {
    const found = await provider.interactionDetails(req, res);
    if (found.uid !== req.params.uid) {
      // The interaction cookie belongs to a newer attempt than the page this request came from.
      throw new errors.SessionNotFound('interaction does not match the page it was submitted from');
    }
    return found;
  };

  router.get('/interaction/:uid', async (req, res) => {
    const interaction = await details(req, res);
    switch (interaction.prompt.name) {
      case 'login':
        sendPage(res, 200, signInPage({ uid: interaction.uid, clientName, users: DEMO_USERS }));
        return;
      case 'consent':
        await grantConsent(interaction, req, res);
        return;
      default:
        await provider.interactionFinished(
          req,
          res,
          { error: 'invalid_request', error_description: `unsupported interaction prompt "${interaction.prompt.name}"` },
          { mergeWithLastSubmission: false },
        );
    }
  });

  router.post('/interaction/:uid/login', form, async (req, res) => {
    const interaction = await details(req, res);
    if (interaction.prompt.name !== 'login') {
      sendPage(res, 400, errorPage({
        heading: 'This sign-in step is already done',
        message: 'Go back to the application and start again if you are not signed in.',
      }));
      return;
    }
    const body: unknown = req.body;
    const sub = isRecord(body) && typeof body['sub'] === 'string' ? body['sub'] : '';
    const user = findDemoUser(sub);
    if (!user) {
      const error = sub === ''
        ? 'Choose one of the people below to sign in as.'
        : `Nobody with the identifier "${sub.slice(0, 80)}" is registered with this development provider. Choose one of the people below.`;
      logger.warn({ sub }, 'sign-in refused: unknown demo user');
      sendPage(res, 400, signInPage({ uid: interaction.uid, clientName, users: DEMO_USERS, error }));
      return;
    }
    logger.info({ sub: user.sub }, 'demo user signed in');
    await provider.interactionFinished(req, res, { login: { accountId: user.sub } }, { mergeWithLastSubmission: false });
  });

  router.post('/interaction/:uid/abort', async (req, res) => {
    await details(req, res);
    await provider.interactionFinished(
      req,
      res,
      { error: 'access_denied', error_description: 'sign-in was cancelled at the identity provider' },
      { mergeWithLastSubmission: false },
    );
  });

  async function grantConsent(interaction: InteractionDetails, req: Request, res: Response): Promise<void> {
    const accountId = interaction.session?.accountId;
    if (interaction.params.client_id !== clientId || accountId === undefined) {
      await provider.interactionFinished(
        req,
        res,
        { error: 'access_denied', error_description: 'only the registered application is granted access automatically' },
        { mergeWithLastSubmission: false },
      );
      return;
    }
    const existing = interaction.grantId ? await provider.Grant.find(interaction.grantId) : undefined;
    const grant = existing ?? new provider.Grant({ accountId, clientId });
    const { missingOIDCScope, missingOIDCClaims, missingResourceScopes } = interaction.prompt.details;
    if (missingOIDCScope) {
      grant.addOIDCScope(missingOIDCScope.join(' '));
    }
    if (missingOIDCClaims) {
      grant.addOIDCClaims(missingOIDCClaims);
    }
    for (const [indicator, scopes] of Object.entries(missingResourceScopes ?? {})) {
      grant.addResourceScope(indicator, scopes.join(' '));
    }
    const grantId = await grant.save();
    await provider.interactionFinished(req, res, { consent: { grantId } }, { mergeWithLastSubmission: true });
  }

  const onError: ErrorRequestHandler = (error: unknown, _req, res, next) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    if (error instanceof errors.SessionNotFound) {
      sendPage(res, 400, errorPage({
        heading: 'This sign-in has expired',
        message: 'The sign-in attempt is over, was already used, or was started in another tab. Go back to the application and sign in again.',
        code: error.error,
      }));
      return;
    }
    logger.error({ err: error }, 'interaction failed');
    sendPage(res, 500, errorPage({
      heading: 'The identity provider failed',
      message: 'Something went wrong on this development provider; its log says what. Try signing in again.',
    }));
  };
  router.use(onError);

  return router;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}
