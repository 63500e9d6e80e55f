import { loadConfig } from '../config';
import { connect } from '../db/client';
import { applyMigrations } from '../db/migrate';
import { createLogger } from '../logger';
import { demoNacelleFillers, demoStudyFillers } from './fillers';
import { seedDemo } from './demo';

/** Migrate and seed the demo scenario: `tsx server/src/seed/main.ts`. */
const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL, 'seed');
const database = connect(config.DATABASE_URL, 2);
try {
  await applyMigrations(database.db);
  const result = await seedDemo(database.db, demoStudyFillers, demoNacelleFillers);
  logger.info(result, result.created ? 'demo scenario seeded' : 'demo scenario already present');
} finally {
  await database.close();
}
