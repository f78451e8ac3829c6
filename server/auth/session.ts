import connectPgSimple from 'connect-pg-simple';
import type { Request, RequestHandler } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { DataSource } from 'typeorm';
import type { Config } from '../config';
import { UnauthorisedError } from '../http/errors';
import { logger } from '../logger';
import { actorFrom, actorRowsSql, loadActor, type Actor, type ActorRow } from './access';

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

/**
 * The session row and its user's roles and grants in one statement: every signed-in request needs
 * both, and a second round trip per request was a sixth of a panel read's CPU. Same expiry rule as
 * connect-pg-simple's own read; a session without a valid user id reads no roles.
 */
const SESSION_AND_ACTOR_SQL = `
  SELECT s.sess,
         (SELECT coalesce(json_agg(json_build_object('id', r.id, 'role', r.role)), '[]'::json)
            FROM (${actorRowsSql('u.id')}) r) AS actor
    FROM session s
    CROSS JOIN LATERAL (SELECT CASE WHEN s.sess ->> 'userId' ~ '^[0-9a-fA-F-]{36}$'
                                    THEN (s.sess ->> 'userId')::uuid END AS id) u
   WHERE s.sid = $1 AND s.expire >= now()`;

/** The actor read with a request's session, for requireUser (which checks it is the same user). */
interface ActorRead {
  userId: string | undefined;
  rows: ActorRow[];
}
const actorOfSession = new WeakMap<object, ActorRead>();
const actorOfRequest = new WeakMap<object, ActorRead>();

export function sessionMiddleware(pool: pg.Pool, secret: string, secure: boolean | 'auto'): RequestHandler {
  const PgStore = connectPgSimple(session);
  class ThrottledStore extends PgStore {
    private readonly touched = new Map<string, number>();
    override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
      const statement = { name: 'session-actor', text: SESSION_AND_ACTOR_SQL, values: [sid] };
      pool.query<{ sess: session.SessionData; actor: ActorRow[] }>(statement, (error, result) => {
        if (error) return callback(error);
        const [row] = result.rows;
        if (!row) return callback(null, null);
        actorOfSession.set(row.sess, { userId: row.sess.userId, rows: row.actor });
        callback(null, row.sess);
      });
    }
    override createSession(req: Request, sess: session.SessionData): session.Session & session.SessionData {
      const read = actorOfSession.get(sess);
      if (read) actorOfRequest.set(req, read);
      return super.createSession(req, sess);
    }
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
      const read = actorOfRequest.get(req);
      // read with the session row of this request, unless another user signed in on it since
      req.actor = read?.userId === userId ? actorFrom(userId, read.rows) : await loadActor(dataSource.manager, userId);
      next();
    } catch (error) {
      next(error);
    }
  };
}
