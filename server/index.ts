import path from 'node:path';
import { createApp } from './app';
import { readConfig } from './config';
import { makeDataSource } from './data-source';
import { logger } from './logger';

/**
 * Idle keep-alive connections stay open this long. Longer than a load balancer's own idle timeout
 * (nginx's upstream keepalive_timeout is 60 s by default, many cloud balancers 60 s): the balancer
 * must be the side that drops an idle connection, or it may send a request down one we are
 * closing at that moment, and a POST that met a closed connection is not retried.
 */
const KEEP_ALIVE_TIMEOUT_MS = 65_000;
/** On SIGTERM, requests in flight get this long to finish before the process exits anyway. */
const SHUTDOWN_GRACE_MS = 10_000;

async function main() {
  const config = readConfig();
  const dataSource = await makeDataSource(config.DATABASE_URL).initialize();
  const app = createApp({ dataSource, config, webDir: path.resolve(__dirname, '..', 'dist') });
  const server = app.listen(config.PORT, config.HOST, () => {
    logger.info({ url: `http://${config.HOST}:${config.PORT}` }, 'Ampwright is serving');
  });
  server.keepAliveTimeout = KEEP_ALIVE_TIMEOUT_MS;
  server.headersTimeout = KEEP_ALIVE_TIMEOUT_MS + 1_000;

  /**
   * A graceful stop, for deploys and scaling down behind a load balancer (README, "Production"):
   * - stop listening: a new connection is refused, which a balancer retries on another process
   *   for any method, since nothing was sent;
   * - requests in flight finish, and every answer from now on says `Connection: close` (a request
   *   already on a kept-alive connection is served, not bounced), so busy connections end;
   * - idle kept-alive connections are closed now and as they go idle (no request is on them);
   * - once no connection is left the pools close (session store, TypeORM, S3, ExifTool) and the
   *   process exits 0; after SHUTDOWN_GRACE_MS it exits 1 whatever is still running.
   */
  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down: finishing the requests in flight');
    app.startDraining();
    // a connection whose answer was already under way when the stop began did not get
    // `Connection: close`: it goes idle afterwards, and Node leaves it open until the keep-alive
    // timeout. Close such connections as they go idle
    const sweep = setInterval(() => server.closeIdleConnections(), 100);
    server.close(async () => {
      clearInterval(sweep);
      try {
        await app.closeResources();
        await dataSource.destroy();
        logger.info('connections and pools closed');
        process.exit(0);
      } catch (error) {
        logger.error({ err: error }, 'closing the pools failed');
        process.exit(1);
      }
    });
    server.closeIdleConnections();
    setTimeout(() => {
      logger.error({ graceMs: SHUTDOWN_GRACE_MS }, 'requests still running at the end of the grace period: exiting');
      process.exit(1);
    }, SHUTDOWN_GRACE_MS).unref();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error) => {
  logger.fatal({ err: error }, 'could not start');
  process.exit(1);
});
