import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/src/db/schema/index.ts',
  out: './migrations',
  dbCredentials: { url: process.env['DATABASE_URL'] ?? 'postgres://laminote@127.0.0.1:54320/laminote' },
});
