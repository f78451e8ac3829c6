import type { Request, RequestHandler } from 'express';
import type { Config } from '../config';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

type OriginConfig = Pick<Config, 'ALLOWED_ORIGINS' | 'APP_URL' | 'PUBLIC_URL'>;

/** The configured origins of the app: ALLOWED_ORIGINS, APP_URL and PUBLIC_URL. */
export function configuredOrigins(config: OriginConfig): Set<string> {
  const origins = new Set(config.ALLOWED_ORIGINS ?? []);
  for (const url of [config.APP_URL, config.PUBLIC_URL]) if (url) origins.add(new URL(url).origin);
  return origins;
}

/** The origin's host (with its port) equals the host the request was sent to: the app's own page. */
function sameHost(origin: string, req: Request): boolean {
  if (!URL.canParse(origin)) return false;
  const url = new URL(origin);
  // `req.host` keeps the port in Express 5 (and follows X-Forwarded-Host behind a trusted proxy);
  // URL drops a scheme's default port, so compare both ways of writing it
  const host = req.host;
  const defaultPort = url.protocol === 'https:' ? '443' : '80';
  return url.host === host || `${url.host}:${defaultPort}` === host;
}

/**
 * Refuses unsafe requests (POST, PUT, PATCH, DELETE) that a page of another origin made with the
 * user's cookie: SameSite=Lax lets through requests from another port of the same host or a
 * sibling subdomain, which are "same site". 403 `cross_site` when
 * - `Origin` is present and is neither the request's own host nor a configured origin
 *   (`Origin: null` from sandboxed frames and some redirects included), or
 * - there is no `Origin` and `Sec-Fetch-Site` is present and not `same-origin` or `none`
 *   (`none` is a request the user started — typed address, bookmark — that no page can cause).
 * A request with neither header is let through: every current browser sends `Origin` on a
 * cross-origin POST/PUT/PATCH/DELETE (fetch and forms alike) and `Sec-Fetch-Site` on every
 * request, so only non-browser clients (curl, scripts, a native app, the tests) send neither —
 * and those hold their own credentials, which is not what this defends against.
 */
export function sameOriginOnly(config: OriginConfig): RequestHandler {
  const allowed = configuredOrigins(config);
  return (req, res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    const site = req.get('sec-fetch-site');
    let refused = false;
    if (origin !== undefined) refused = !(allowed.has(origin) || sameHost(origin, req));
    else if (site !== undefined) refused = site !== 'same-origin' && site !== 'none';
    if (!refused) return next();
    res.status(403).json({
      error: {
        code: 'cross_site',
        message: 'This request came from another site and was refused. Open Ampwright at its own address and try again.',
      },
    });
  };
}

/** Does the request carry a body (a zero Content-Length, as browsers send for an empty POST, is none)? */
function hasBody(req: Request): boolean {
  if (req.get('transfer-encoding') !== undefined) return true;
  const length = Number(req.get('content-length') ?? 0);
  return Number.isFinite(length) && length > 0;
}

/**
 * Every API body is JSON (photo uploads are multipart, on their own route): any other content
 * type with a body answers 415, instead of being skipped by the JSON parser and handled as an
 * empty body (a PATCH sent as text/plain used to answer 200 and change nothing).
 */
export function jsonBodiesOnly(multipartPaths: RegExp): RequestHandler {
  return (req, res, next) => {
    if (!hasBody(req) || req.is('application/json')) return next();
    if (req.is('multipart/form-data') && multipartPaths.test(req.path)) return next();
    res.status(415).json({
      error: {
        code: 'unsupported_media_type',
        message: 'Send the body as JSON (Content-Type: application/json)',
      },
    });
  };
}
