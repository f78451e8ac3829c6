import path from 'node:path';
import { createApp } from './app';
import { readConfig } from './config';
import { makeDataSource } from './data-source';
import { logger } from './logger';

async function main() {
  const config = readConfig();
  const dataSource = await makeDataSource(config.DATABASE_URL).initialize();
  const app = createApp({ dataSource, config, webDir: path.resolve(__dirname, '..', 'dist') });
  const server = app.listen(config.PORT, config.HOST, () => {
    logger.info({ url: `http://${config.HOST}:${config.PORT}` }, 'Ampwright is serving');
  });

  // finish the requests in flight, then close the pools
  const shutdown = (signal: string) => {
    logger.info({ signal }, 'shutting down');
    server.close(async () => {
      await app.closeResources();
      await dataSource.destroy();
      process.exit(0);
    });
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error) => {
  logger.fatal({ err: error }, 'could not start');
  process.exit(1);
});
