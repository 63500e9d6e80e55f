/**
 * What scripts/test.ts started for the API and browser tests, read from the environment it sets.
 * Running these tests some other way fails here with a message saying how to run them.
 */
function need(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set: run the API and browser tests through \`npm test\` (scripts/test.ts), which starts their services.`);
  return value;
}

export const testEnv = {
  /** A database on the throw-away test server to connect to when creating databases. */
  get pgAdminUrl() {
    return need('TEST_PG_ADMIN_URL');
  },
  /** Name of the migrated template database each test file copies. */
  get templateDatabase() {
    return need('TEST_TEMPLATE_DB');
  },
  get oidcIssuer() {
    return need('OIDC_ISSUER');
  },
  get publicUrl() {
    return need('PUBLIC_URL');
  },
  get smtpPort() {
    return Number(need('SMTP_PORT'));
  },
  /** Only for the browser tests: the pid of the job worker process (one node process). */
  get workerPid() {
    return Number(need('TEST_WORKER_PID'));
  },
  /** Only for the browser tests: the running app. */
  get appUrl() {
    return need('APP_URL');
  },
};
