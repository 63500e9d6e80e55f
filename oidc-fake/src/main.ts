/**
 * Starts the local identity provider: `npx tsx oidc-fake/src/main.ts`.
 *
 * Environment (all optional): OIDC_PORT (4400), OIDC_HOST (127.0.0.1: loopback only), OIDC_ISSUER
 * (http://127.0.0.1:$OIDC_PORT), DATA_DIR (the repo's .data/), OIDC_CLIENT_ID, OIDC_CLIENT_SECRET,
 * OIDC_REDIRECT_URIS and OIDC_POST_LOGOUT_URIS (comma-separated), LOG_LEVEL.
 */
import { pino } from 'pino';
import { ConfigError, readEnvironment } from './config';
import { createIdentityProvider } from './provider';
import { DEMO_USERS } from './users';

async function main(): Promise<void> {
  const environment = readEnvironment();
  const logger = pino({ name: 'oidc-fake', level: environment.logLevel });
  const identityProvider = createIdentityProvider({
    issuer: environment.issuer,
    dataDir: environment.dataDir,
    client: environment.client,
    logger,
  });
  const close = await identityProvider.listen(environment.port, environment.host);
  logger.info(
    { issuer: identityProvider.issuer, clientId: identityProvider.client.clientId, users: DEMO_USERS.map((user) => user.sub) },
    'Tamsk identity (development) is ready',
  );

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) {
      return;
    }
    stopping = true;
    logger.info({ signal }, 'identity provider stopping');
    close().then(
      () => process.exit(0),
      (error: unknown) => {
        logger.error({ err: error }, 'identity provider did not close cleanly');
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error: unknown) => {
  // A configuration mistake is one readable line; anything else keeps its stack for the developer.
  const message = error instanceof ConfigError ? error.message : error instanceof Error ? error.stack ?? error.message : String(error);
  process.stderr.write(`oidc-fake: ${message}\n`);
  process.exit(1);
});
