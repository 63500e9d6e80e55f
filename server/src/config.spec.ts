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

  it('refuses the development session secret in production', () => {
    expect(() => loadConfig({ ...base, NODE_ENV: 'production' })).toThrow(/SESSION_SECRET/);
    expect(loadConfig({ ...base, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-enough-length' }).NODE_ENV).toBe('production');
  });

  it('drops a trailing slash from PUBLIC_URL so redirect URIs are exact', () => {
    expect(loadConfig({ ...base, PUBLIC_URL: 'https://laminote.tamsk.example/' }).PUBLIC_URL).toBe('https://laminote.tamsk.example');
  });
});
