/**
 * Types for the part of `oidc-provider` 9 that the fake uses. The package ships no declarations and
 * DefinitelyTyped's lag a major version behind, so this covers only what oidc-fake calls, checked
 * against node_modules/oidc-provider/lib (provider.js, helpers/defaults.js, models/grant.js).
 */
declare module 'oidc-provider' {
  import type { IncomingMessage, ServerResponse } from 'node:http';

  export interface ClientRecord {
    readonly clientId: string;
    readonly clientName?: string;
  }

  /** The few members of the Koa context that the rendering hooks touch. */
  export interface ProviderContext {
    body: unknown;
    type: string;
    status: number;
    readonly host: string;
    readonly path: string;
    readonly method: string;
    set(field: string, value: string): void;
    readonly oidc: {
      readonly client?: ClientRecord;
      readonly route?: string;
    };
  }

  export interface ErrorOut {
    error: string;
    error_description?: string;
    state?: string;
    iss?: string;
  }

  export interface AccountClaims {
    sub: string;
    [claim: string]: unknown;
  }

  export interface Account {
    accountId: string;
    claims(use: string, scope: string): AccountClaims | Promise<AccountClaims>;
  }

  export interface AdapterPayload {
    [key: string]: unknown;
    uid?: string;
    grantId?: string;
    userCode?: string;
    consumed?: number;
  }

  export interface Adapter {
    upsert(id: string, payload: AdapterPayload, expiresIn: number | undefined): Promise<void>;
    find(id: string): Promise<AdapterPayload | undefined>;
    findByUid(uid: string): Promise<AdapterPayload | undefined>;
    findByUserCode(userCode: string): Promise<AdapterPayload | undefined>;
    consume(id: string): Promise<void>;
    destroy(id: string): Promise<void>;
    revokeByGrantId(grantId: string): Promise<void>;
  }

  export interface ClientMetadata {
    client_id: string;
    client_secret?: string;
    client_name?: string;
    application_type?: 'web' | 'native';
    redirect_uris: string[];
    post_logout_redirect_uris?: string[];
    grant_types?: string[];
    response_types?: string[];
    token_endpoint_auth_method?: string;
  }

  export interface CookieOptions {
    httpOnly?: boolean;
    sameSite?: 'lax' | 'strict' | 'none';
    secure?: boolean;
    path?: string;
  }

  export interface JsonWebKey {
    kty: string;
    kid?: string;
    alg?: string;
    use?: string;
    [member: string]: unknown;
  }

  export interface Configuration {
    adapter?: (modelName: string) => Adapter;
    clients?: ClientMetadata[];
    jwks?: { keys: JsonWebKey[] };
    cookies?: { keys?: string[]; long?: CookieOptions; short?: CookieOptions };
    claims?: Record<string, string[] | null>;
    scopes?: string[];
    responseTypes?: string[];
    conformIdTokenClaims?: boolean;
    clientBasedCORS?: (ctx: ProviderContext, origin: string, client: ClientRecord) => boolean;
    findAccount?: (ctx: ProviderContext, sub: string) => Promise<Account | undefined>;
    interactions?: { url?: (ctx: ProviderContext, interaction: { uid: string }) => string | Promise<string> };
    pkce?: { required?: (ctx: ProviderContext, client: ClientRecord) => boolean };
    renderError?: (ctx: ProviderContext, out: ErrorOut, error: Error) => void | Promise<void>;
    ttl?: Record<string, number>;
    features?: {
      devInteractions?: { enabled: boolean };
      revocation?: { enabled: boolean };
      userinfo?: { enabled: boolean };
      rpInitiatedLogout?: {
        enabled: boolean;
        logoutSource?: (ctx: ProviderContext, form: string) => void | Promise<void>;
        postLogoutSuccessSource?: (ctx: ProviderContext) => void | Promise<void>;
      };
    };
  }

  export interface PromptDetails {
    missingOIDCScope?: string[];
    missingOIDCClaims?: string[];
    missingResourceScopes?: Record<string, string[]>;
  }

  export interface InteractionDetails {
    readonly uid: string;
    readonly prompt: { name: string; reasons: string[]; details: PromptDetails };
    readonly params: { client_id?: string; [param: string]: unknown };
    readonly session?: { accountId: string; uid: string };
    readonly grantId?: string;
  }

  export interface InteractionResults {
    login?: { accountId: string; remember?: boolean };
    consent?: { grantId?: string };
    error?: string;
    error_description?: string;
  }

  export interface Grant {
    addOIDCScope(scope: string): void;
    addOIDCClaims(claims: string[]): void;
    addResourceScope(resource: string, scope: string): void;
    save(): Promise<string>;
  }

  export interface GrantConstructor {
    new (init: { accountId: string; clientId: string }): Grant;
    find(id: string): Promise<Grant | undefined>;
  }

  type ErrorEvent =
    | 'server_error'
    | 'authorization.error'
    | 'grant.error'
    | 'end_session.error'
    | 'userinfo.error'
    | 'revocation.error'
    | 'discovery.error'
    | 'jwks.error';

  export default class Provider {
    constructor(issuer: string, configuration?: Configuration);
    readonly issuer: string;
    proxy: boolean;
    readonly Grant: GrantConstructor;
    readonly Client: { find(id: string): Promise<ClientRecord | undefined> };
    callback(): (req: IncomingMessage, res: ServerResponse) => void;
    urlFor(name: string, params?: Record<string, string>): string;
    interactionDetails(req: IncomingMessage, res: ServerResponse): Promise<InteractionDetails>;
    interactionFinished(
      req: IncomingMessage,
      res: ServerResponse,
      result: InteractionResults,
      options?: { mergeWithLastSubmission?: boolean },
    ): Promise<void>;
    on(event: ErrorEvent, listener: (ctx: ProviderContext, error: Error) => void): this;
    on(event: 'end_session.success', listener: (ctx: ProviderContext) => void): this;
  }

  export namespace errors {
    class OIDCProviderError extends Error {
      readonly status: number;
      readonly statusCode: number;
      readonly error: string;
      readonly error_description?: string;
      readonly expose: boolean;
    }
    class SessionNotFound extends OIDCProviderError {}
  }
}
