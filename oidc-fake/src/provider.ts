import { createServer } from 'node:http';
import express, { type Express, type Response } from 'express';
import Provider, { errors, type Configuration, type ProviderContext } from 'oidc-provider';
import { pino, type Logger } from 'pino';
import { ConfigError, readEnvironment, type ClientSettings } from './config';
import { interactionRoutes } from './interactions';
import { loadOrCreateKeys } from './keys';
import { createMemoryAdapterFactory } from './memory-adapter';
import { ASSETS, errorPage, pageSecurityHeaders, signedOutPage, signOutPage } from './pages';
import { findDemoUser } from './users';

export interface IdentityProviderOptions {
  /** Issuer identifier; default `http://127.0.0.1:${OIDC_PORT || 4400}`. Must not carry a path. */
  issuer?: string;
  /** Where `oidc/jwks.json` and `oidc/cookie-keys.json` live; default DATA_DIR or the repo's `.data/`. */
  dataDir?: string;
  /** The one registered application; each field defaults from the OIDC_CLIENT_* variables. */
  client?: Partial<ClientSettings>;
  logger?: Logger;
}

export interface IdentityProvider {
  readonly issuer: string;
  readonly client: ClientSettings;
  /** Express app: our pages and interaction routes, then oidc-provider for everything else. */
  readonly app: Express;
  readonly provider: Provider;
  /** Starts listening; resolves to a function that stops the server. */
  listen(port: number, host?: string): Promise<() => Promise<void>>;
}

const CLIENT_NAME = 'Laminote';

const PROVIDER_ERROR_EVENTS = [
  'server_error',
  'authorization.error',
  'grant.error',
  'end_session.error',
  'userinfo.error',
  'revocation.error',
  'discovery.error',
  'jwks.error',
] as const;

/**
 * A local OpenID Connect provider for development and tests, with the Tamsk demo users. Unset options
 * fall back to the environment variables `main.ts` documents.
 */
export function createIdentityProvider(options: IdentityProviderOptions = {}): IdentityProvider {
  const environment = readEnvironment();
  const issuer = options.issuer ?? environment.issuer;
  const dataDir = options.dataDir ?? environment.dataDir;
  const client: ClientSettings = { ...environment.client, ...options.client };
  const logger = options.logger ?? pino({ name: 'oidc-fake', level: environment.logLevel });

  const issuerUrl = URL.parse(issuer);
  if (!issuerUrl || (issuerUrl.protocol !== 'http:' && issuerUrl.protocol !== 'https:')) {
    throw new ConfigError(`OIDC_ISSUER: "${issuer}" is not an absolute http(s) URL`);
  }
  if (issuerUrl.pathname !== '/' || issuer.endsWith('/')) {
    throw new ConfigError(`OIDC_ISSUER: "${issuer}" must be an origin without a path or trailing slash`);
  }

  const keys = loadOrCreateKeys(dataDir);
  const formTargets = [...new Set([...client.redirectUris, ...client.postLogoutRedirectUris].map((uri) => new URL(uri).origin))];
  const headers = pageSecurityHeaders(formTargets);

  const renderInto = (ctx: ProviderContext, html: string) => {
    for (const [name, value] of Object.entries(headers)) {
      ctx.set(name, value);
    }
    ctx.type = 'html';
    ctx.body = html;
  };

  const configuration: Configuration = {
    adapter: createMemoryAdapterFactory(),
    clients: [
      {
        client_id: client.clientId,
        client_secret: client.clientSecret,
        client_name: CLIENT_NAME,
        application_type: 'web',
        redirect_uris: client.redirectUris,
        post_logout_redirect_uris: client.postLogoutRedirectUris,
        grant_types: ['authorization_code', 'refresh_token'],
        response_types: ['code'],
        // oidc-provider accepts the secret by either client_secret_basic or client_secret_post for a
        // client registered with either one.
        token_endpoint_auth_method: 'client_secret_basic',
      },
    ],
    jwks: keys.jwks,
    cookies: { keys: keys.cookieKeys },
    claims: {
      openid: ['sub'],
      email: ['email', 'email_verified'],
      profile: ['name'],
    },
    scopes: ['openid', 'email', 'profile', 'offline_access'],
    responseTypes: ['code'],
    // Put the profile and e-mail claims in the ID token too, so the app needs no userinfo call.
    conformIdTokenClaims: false,
    clientBasedCORS: () => false,
    pkce: { required: () => true },
    findAccount: async (_ctx, sub) => {
      const user = findDemoUser(sub);
      if (!user) {
        return undefined;
      }
      return {
        accountId: user.sub,
        claims: () => ({ sub: user.sub, email: user.email, email_verified: true, name: user.name }),
      };
    },
    interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
    ttl: {
      AccessToken: 60 * 60,
      AuthorizationCode: 60,
      IdToken: 60 * 60,
      Interaction: 60 * 60,
      Grant: 24 * 60 * 60,
      RefreshToken: 24 * 60 * 60,
      Session: 24 * 60 * 60,
    },
    features: {
      devInteractions: { enabled: false },
      revocation: { enabled: true },
      userinfo: { enabled: true },
      rpInitiatedLogout: {
        enabled: true,
        logoutSource: (ctx, form) => renderInto(ctx, signOutPage(form, ctx.oidc.client?.clientName)),
        postLogoutSuccessSource: (ctx) => renderInto(ctx, signedOutPage(ctx.oidc.client?.clientName)),
      },
    },
    renderError: (ctx, out) =>
      renderInto(ctx, errorPage({
        heading: 'This request could not be completed',
        message: out.error_description ?? 'The identity provider refused the request.',
        code: out.error,
      })),
  };

  const provider = new Provider(issuer, configuration);
  for (const event of PROVIDER_ERROR_EVENTS) {
    provider.on(event, (ctx, error) => {
      const where = { path: ctx.path, method: ctx.method };
      if (error instanceof errors.OIDCProviderError && error.expose) {
        // A request the provider refused by the protocol's rules: worth a line, not a stack.
        logger.warn({ ...where, error: error.error, description: error.error_description }, `identity provider ${event}`);
      } else {
        logger.error({ ...where, err: error }, `identity provider ${event}`);
      }
    });
  }
  provider.on('end_session.success', () => logger.info('provider session ended'));

  const sendPage = (res: Response, status: number, html: string) => {
    res.status(status).set(headers).type('html').send(html);
  };

  const app = express();
  app.disable('x-powered-by');
  app.get('/assets/*file', (req, res, next) => {
    const asset = ASSETS.get(req.path);
    if (!asset) {
      next();
      return;
    }
    res.set({ 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-cache' }).type(asset.type).send(asset.body);
  });
  // Browsers ask every origin for an icon; answer with nothing rather than a 404 in their console.
  app.get('/favicon.ico', (_req, res) => {
    res.status(204).end();
  });
  app.use(interactionRoutes({ provider, clientId: client.clientId, clientName: CLIENT_NAME, logger, sendPage }));
  app.use(provider.callback());

  return {
    issuer,
    client,
    app,
    provider,
    listen(port, host = '127.0.0.1') {
      const server = createServer(app);
      return new Promise((resolve, reject) => {
        server.once('error', reject);
        server.listen(port, host, () => {
          server.off('error', reject);
          logger.info({ issuer, address: server.address() }, 'identity provider listening');
          resolve(
            () =>
              new Promise<void>((done, fail) => {
                server.close((error) => (error ? fail(error) : done()));
                server.closeIdleConnections();
              }),
          );
        });
      });
    },
  };
}
