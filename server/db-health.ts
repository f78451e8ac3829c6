/**
 * The database going away (a restart, a failover of a managed PostgreSQL, a network cut) is a
 * passing state, not a bug: the API answers 503 with Retry-After and serves again once the pools
 * reconnect, which they do by themselves on the next checkout. The process must never die of it.
 */
import type pg from 'pg';
import { logger } from './logger';

/** Seconds a client should wait before trying again while the database is unavailable. */
export const DB_RETRY_AFTER_S = 5;

/**
 * SQLSTATEs that mean "no database right now" (PostgreSQL appendix A): class 08 connection
 * exceptions, 57P01 admin_shutdown (pg_ctl stop), 57P02 crash_shutdown, 57P03 cannot_connect_now
 * (starting up or in recovery), 53300 too_many_connections.
 */
const UNAVAILABLE_SQLSTATE = /^(08\d{3}|57P01|57P02|57P03|53300)$/;
/** Socket errors from connecting or from a connection that broke. */
const UNAVAILABLE_ERRNO = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN']);
/** What pg says when the server closed the socket, or a connect or checkout timed out. */
const UNAVAILABLE_MESSAGE = /Connection terminated|connection timeout|timeout exceeded when trying to connect|Client has encountered a connection error|Connection refused/i;

interface ErrorLike {
  code?: unknown;
  message?: unknown;
  driverError?: unknown;
  cause?: unknown;
  errors?: unknown;
}

/**
 * True when an error (or what it wraps: TypeORM's `driverError`, a `cause`, an AggregateError's
 * `errors`) says the database could not be reached, as opposed to a query it refused.
 */
export function isDatabaseUnavailable(error: unknown, depth = 0): boolean {
  if (!error || typeof error !== 'object' || depth > 4) return false;
  const e = error as ErrorLike;
  if (typeof e.code === 'string' && (UNAVAILABLE_SQLSTATE.test(e.code) || UNAVAILABLE_ERRNO.has(e.code))) return true;
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGE.test(e.message)) return true;
  const inner = [e.driverError, e.cause, ...(Array.isArray(e.errors) ? e.errors : [])];
  return inner.some((i) => isDatabaseUnavailable(i, depth + 1));
}

/**
 * pg emits 'error' on a pool when an idle connection breaks (the server restarted); an 'error'
 * event without a listener would end the process. The broken client is already discarded by the
 * pool, so logging is all there is to do.
 */
export function poolErrorLogger(pool: string): (error: Error) => void {
  return (error) => logger.warn({ err: error, pool }, 'a pooled database connection broke; the pool will reconnect');
}

/** Hooks a pool up: a listener for its errors. */
export function guardPool(pool: pg.Pool, name: string): pg.Pool {
  pool.on('error', poolErrorLogger(name));
  return pool;
}

/**
 * What each process calls its connections (pg_stat_activity.application_name): with N processes
 * an operator can tell whose they are, and a test can see one process let go of all of its own.
 */
export const DB_APPLICATION_NAME = `ampwright:${process.pid}`;

/** How long a request waits for a new database connection before it fails (and answers 503). */
export const DB_CONNECT_TIMEOUT_MS = 5_000;
