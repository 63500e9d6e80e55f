import * as client from 'openid-client';
import type { Config } from '../config';

/**
 * The OpenID Connect relying party. Discovery is lazy and retried, so the server can start before the
 * identity provider does. Works with any standard provider; plain http is allowed only for a loopback
 * issuer (the local development provider).
 */
export interface OidcClient {
  configuration(): Promise<client.Configuration>;
}

export function isLoopbackUrl(url: string): boolean {
  const host = new URL(url).hostname;
  return host === 'localhost' || host === '[::1]' || host.startsWith('127.');
}

export function createOidcClient(config: Config): OidcClient {
  let pending: Promise<client.Configuration> | null = null;
  return {
    configuration() {
      pending ??= client
        .discovery(
          new URL(config.OIDC_ISSUER),
          config.OIDC_CLIENT_ID,
          config.OIDC_CLIENT_SECRET,
          client.ClientSecretBasic(config.OIDC_CLIENT_SECRET),
          isLoopbackUrl(config.OIDC_ISSUER) ? { execute: [client.allowInsecureRequests] } : undefined,
        )
        .catch((err: unknown) => {
          pending = null;
          throw err;
        });
      return pending;
    },
  };
}
