import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';

describe('configuration from the environment', () => {
  const base = { DATABASE_URL: 'postgres://u@127.0.0.1:54320/laminote' };

  it('fills the documented defaults (DESIGN.md default local addresses)', () => {
    const config = loadConfig(base);
    expect(config.PORT).toBe(4200);
    expect(config.HOST).toBe('127.0.0.1');
    expect(config.PUBLIC_URL).toBe('http://127.0.0.1:4200');
    expect(config.OIDC_ISSUER).toBe('http://127.0.0.1:4400');
    expect(config.SMTP_PORT).toBe(2525);
  });

  it('names the variable at fault', () => {
    expect(() => loadConfig({ ...base, PORT: 'eighty' })).toThrow(/PORT/);
    expect(() => loadConfig({})).toThrow(/DATABASE_URL/);
    expect(() => loadConfig({ ...base, PORT: '70000' })).toThrow(ConfigError);
  });

  it('refuses the built-in session and identity-provider secrets in production', () => {
    expect(() => loadConfig({ ...base, NODE_ENV: 'production' })).toThrow(/SESSION_SECRET/);
    expect(() => loadConfig({ ...base, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-enough-length' })).toThrow(/OIDC_CLIENT_SECRET/);
    const production = { ...base, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-enough-length', OIDC_CLIENT_SECRET: 'from-the-provider' };
    expect(loadConfig(production).NODE_ENV).toBe('production');
    // Development and tests keep working without either.
    expect(loadConfig({ ...base, NODE_ENV: 'development' }).OIDC_CLIENT_SECRET).toBe('laminote-dev-secret');
  });

  it('asks for an encrypted connection to a mail server beyond this machine in production, with user and password together', () => {
    const production = { ...base, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-enough-length', OIDC_CLIENT_SECRET: 'from-the-provider' };
    expect(() => loadConfig({ ...production, SMTP_HOST: 'mail.tamsk.example' })).toThrow(/SMTP_SECURITY/);
    expect(() => loadConfig({ ...production, SMTP_HOST: 'mail.tamsk.example', SMTP_SECURITY: 'starttls', SMTP_USER: 'laminote' })).toThrow(/SMTP_PASSWORD/);
    const mail = loadConfig({ ...production, SMTP_HOST: 'mail.tamsk.example', SMTP_PORT: '587', SMTP_SECURITY: 'starttls', SMTP_USER: 'laminote', SMTP_PASSWORD: 'pw' });
    expect([mail.SMTP_SECURITY, mail.SMTP_USER]).toEqual(['starttls', 'laminote']);
    expect(() => loadConfig({ ...production, SMTP_SECURITY: 'ssl' })).toThrow(/SMTP_SECURITY/);
  });

  it('drops a trailing slash from PUBLIC_URL so redirect URIs are exact', () => {
    expect(loadConfig({ ...base, PUBLIC_URL: 'https://laminote.tamsk.example/' }).PUBLIC_URL).toBe('https://laminote.tamsk.example');
  });
});
