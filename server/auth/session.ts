import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { DataSource } from 'typeorm';
import type { Config } from '../config';
import { UnauthorisedError } from '../http/errors';
import { logger } from '../logger';
import { loadActor, type Actor } from './access';

declare module 'express-session' {
  interface SessionData {
    userId: string;
  }
}
declare module 'express-serve-static-core' {
  interface Request {
    actor: Actor;
  }
}

const THIRTY_DAYS_MS = 30 * 24 * 3600 * 1000;

/**
 * How long a session's stored expiry may lag its rolling cookie. express-session touches the
 * store on every request that does not change the session; a write per read (a panel GET, a pull)
 * for an expiry 30 days out buys nothing, so each process writes it at most this often per session.
 */
export const TOUCH_EVERY_MS = 10 * 60 * 1000;
const TOUCHES_KEPT = 10_000;

/** Sessions live in PostgreSQL (the `session` table from the migrations), so any process can serve. */
/**
 * The session cookie's Secure flag (COOKIE_SECURE): in production always, unless turned off for a
 * plain-http setup; elsewhere only when the request came over https (`auto`, which needs
 * TRUST_PROXY=1 behind a TLS-terminating proxy). A Secure cookie is not sent at all over plain http.
 */
export function cookieSecure(config: Pick<Config, 'NODE_ENV' | 'COOKIE_SECURE'>): boolean | 'auto' {
  const setting = config.COOKIE_SECURE ?? (config.NODE_ENV === 'production' ? '1' : 'auto');
  return setting === 'auto' ? 'auto' : setting === '1';
}

export function sessionMiddleware(pool: pg.Pool, secret: string, secure: boolean | 'auto'): RequestHandler {
  const PgStore = connectPgSimple(session);
  class ThrottledStore extends PgStore {
    private readonly touched = new Map<string, number>();
    override touch(sid: string, sess: session.SessionData, callback?: () => void): void {
      const now = Date.now();
      const last = this.touched.get(sid);
      if (last !== undefined && now - last < TOUCH_EVERY_MS) {
        callback?.();
        return;
      }
      // a bounded memo: forgetting only means one more write
      if (this.touched.size >= TOUCHES_KEPT) this.touched.clear();
      this.touched.set(sid, now);
      super.touch(sid, sess, callback);
    }
  }
  return session({
    // a store error reaches the error handler through next(); its own log goes to ours, not stderr
    store: new ThrottledStore({
      pool,
      tableName: 'session',
      createTableIfMissing: false,
      errorLog: (...args: unknown[]) => logger.warn({ detail: args.map(String).join(' ') }, 'session store error'),
    }),
    name: 'ampwright.sid',
    secret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    // a field device may stay offline for weeks; the session outlives that
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: THIRTY_DAYS_MS },
  });
}

/** 401 unless signed in; loads the signed-in user's roles and grants as `req.actor`. */
export function requireUser(dataSource: DataSource): RequestHandler {
  return async (req, _res, next) => {
    try {
      const userId = req.session?.userId;
      if (!userId) throw new UnauthorisedError();
      req.actor = await loadActor(dataSource.manager, userId);
      next();
    } catch (error) {
      next(error);
    }
  };
}
