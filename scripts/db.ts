/**
 * Database chores for the start and test scripts:
 *   migrate        run pending migrations
 *   seed-if-empty  load the demo scenario when the database has no organisation yet
 *   reset          drop everything and migrate again (throwaway test databases only)
 */
import { makeDataSource } from '../server/data-source';
import { logger } from '../server/logger';
import { seedDemo } from '../server/services/seed';
import { DEMO_USERS } from './demo-data';

async function main() {
  const command = process.argv[2];
  const ds = await makeDataSource().initialize();
  try {
    if (command === 'migrate') {
      const ran = await ds.runMigrations({ transaction: 'each' });
      logger.info({ migrations: ran.map((m) => m.name) }, ran.length ? 'migrated' : 'schema up to date');
    } else if (command === 'seed-if-empty') {
      // the sign-ins are said once, by scripts/start.sh beside the address (and in the README)
      if (await seedDemo(ds)) logger.info({ accounts: DEMO_USERS.length }, 'demo scenario loaded');
    } else if (command === 'reset') {
      await ds.dropDatabase();
      await ds.runMigrations({ transaction: 'each' });
    } else {
      throw new Error(`unknown command ${command ?? '(none)'}: migrate | seed-if-empty | reset`);
    }
  } finally {
    await ds.destroy();
  }
}

main().catch((error) => {
  logger.fatal({ err: error }, 'database chore failed');
  process.exit(1);
});
