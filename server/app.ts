import fs from 'node:fs';
import type http from 'node:http';
import path from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet from 'helmet';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { authRouter, meRouter } from './auth/routes';
import { cookieSecure, sessionMiddleware } from './auth/session';
import type { Config } from './config';
import { DB_APPLICATION_NAME, DB_CONNECT_TIMEOUT_MS, guardPool } from './db-health';
import { errorHandler } from './http/error-handler';
import type { LimitConfig } from './http/rate-limits';
import { requestLog } from './http/request-log';
import { COMPRESS_SETTING } from './http/send-json';
import { jsonBodiesOnly, sameOriginOnly } from './http/same-origin';
import { accessRouter } from './routes/access';
import { documentsRouter } from './routes/documents';
import { photosRouter } from './routes/photos';
import { recordsRouter } from './routes/records';
import { registerRouter } from './routes/register';
import { syncRouter } from './routes/sync';
import { closePhotoTools } from './services/photo-image';
import { type MailConfig } from './services/mail';
import { PhotoStore, type PhotoStoreConfig } from './services/photo-store';

export interface AppDeps {
  dataSource: DataSource;
  config: Pick<Config, 'NODE_ENV' | 'DATABASE_URL' | 'SESSION_SECRET' | 'TRUST_PROXY' | 'COOKIE_SECURE' | 'PUBLIC_URL' | 'ALLOWED_ORIGINS'> &
    LimitConfig &
    PhotoStoreConfig &
    MailConfig;
  /** the exported web build to serve beside the API, if present */
  webDir?: string;
  /**
   * gzip/brotli answers and the build's precompressed copies when the client accepts them (default
   * true; the bench turns it off for its baseline)
   */
  compress?: boolean;
}

export interface App extends Express {
  /** closes what createApp opened (session pool, S3 client, ExifTool); the DataSource is the caller's */
  closeResources(): Promise<void>;
  /**
   * The process is stopping (server/index.ts): every answer from now on closes its connection, so
   * a load balancer's kept-alive connections end after the request they carry instead of bringing
   * more; the health check answers 503 so that a balancer that polls it stops sending.
   */
  startDraining(): void;
}

/** A file whose name carries a content hash (Metro's bundles, exported assets) never changes. */
const HASHED = /(^|\/)_expo\/static\/|\.[0-9a-f]{32}(@\dx)?\.[a-z0-9]+$/i;
/** Must be asked for again every time: they name the hashed files of the current build. */
const ALWAYS_REVALIDATE = new Set(['index.html', 'sw.js']);

/** Cache-Control for a file of the web build, by its path relative to webDir. */
export function staticCacheControl(relativePath: string): string {
  const file = relativePath.split(path.sep).join('/');
  if (ALWAYS_REVALIDATE.has(file)) return 'no-cache';
  if (HASHED.test(file)) return 'public, max-age=31536000, immutable';
  return 'public, max-age=3600';
}

export function createApp({ dataSource, config, webDir, compress = true }: AppDeps): App {
  const app = express() as App;
  app.disable('x-powered-by');
  if (config.TRUST_PROXY === '1') app.set('trust proxy', 1);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // WebAssembly: the door-card reader's worker compiles the text recogniser (tesseract.js-core)
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          'font-src': ["'self'", 'data:'],
        },
      },
    }),
  );
  app.use(requestLog);
  let draining = false;
  app.use((_req, res, next) => {
    if (draining) res.setHeader('Connection', 'close');
    next();
  });
  // a phone on a weak signal: JSON and the JS bundle shrink 6–15× (brotli when the client offers
  // it, else gzip); images and PDFs are left alone by the middleware's compressible-type check
  app.set(COMPRESS_SETTING, compress);
  if (compress) app.use(compression());
  // before any session or body is read: a cross-site write, or a body that is not JSON (photos
  // are multipart), is refused here (server/http/same-origin.ts)
  app.use('/api', sameOriginOnly(config), jsonBodiesOnly(/^\/photos\//));

  // health first and without a session: load balancers call it often
  app.get('/api/health', async (_req, res) => {
    if (draining) {
      res.status(503).json({ ok: false, db: 'unknown', draining: true });
      return;
    }
    try {
      await dataSource.query('SELECT 1');
      res.json({ ok: true, db: 'up' });
    } catch {
      res.status(503).json({ ok: false, db: 'down' });
    }
  });

  // its own small pool, with an 'error' listener: without one a connection dropped by a database
  // restart ends the process (server/db-health.ts)
  const sessionPool = guardPool(
    new pg.Pool({
      connectionString: config.DATABASE_URL,
      max: 4,
      connectionTimeoutMillis: DB_CONNECT_TIMEOUT_MS,
      application_name: DB_APPLICATION_NAME,
    }),
    'session',
  );
  // a full push (500 mutations) can pass 2 MB; its body is read here and skipped by the next parser
  app.use('/api/sync', express.json({ limit: '5mb' }));
  app.use('/api', express.json({ limit: '2mb' }), sessionMiddleware(sessionPool, config.SESSION_SECRET, cookieSecure(config)));
  app.use('/api/auth', authRouter(dataSource, config));
  app.use('/api', meRouter(dataSource));
  // before the register router, whose requireUser would otherwise load the actor a second time
  // (and so are the photos)
  app.use('/api/sync', syncRouter(dataSource));
  const photoStore = new PhotoStore(config);
  app.use('/api', accessRouter(dataSource, config, photoStore)); // public one-time links first
  app.use('/api/photos', photosRouter(dataSource, photoStore));
  app.use('/api', registerRouter(dataSource));
  app.use('/api', recordsRouter(dataSource));
  app.use('/api', documentsRouter(dataSource, photoStore, config));
  app.use('/api', (_req, res) => {
    res.status(404).json({ error: { code: 'not_found', message: 'No such API route' } });
  });

  if (webDir && fs.existsSync(path.join(webDir, 'index.html'))) {
    const setHeaders = (res: http.ServerResponse, file: string) => {
      const original = file.replace(/\.(br|gz)$/, '');
      res.setHeader('Cache-Control', staticCacheControl(path.relative(webDir, original)));
    };
    // the build's own brotli/gzip copies (scripts/precompress.ts) when the client takes them:
    // smaller than the middleware's on-the-fly compression, and no CPU per request
    const serveFiles = compress
      ? expressStaticGzip(webDir, {
          enableBrotli: true,
          orderPreference: ['br', 'gzip'],
          index: false,
          serveStatic: { index: false, setHeaders },
        })
      : express.static(webDir, { index: false, setHeaders });
    app.use(serveFiles);
    // client-side routes: any other GET without a file extension gets the single-page app
    app.get(/^\/(?!api\/).*$/, (req, res, next) => {
      if (path.extname(req.path)) return next();
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile('index.html', { root: webDir });
    });
  }

  app.use(errorHandler);
  app.startDraining = () => {
    draining = true;
  };
  app.closeResources = async () => {
    photoStore.close();
    await closePhotoTools();
    await sessionPool.end();
  };
  return app;
}
