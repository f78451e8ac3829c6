import zlib from 'node:zlib';
import type { Request, Response } from 'express';
import Negotiator from 'negotiator';

/** The app setting `createApp({ compress: false })` turns off (the bench's uncompressed baseline). */
export const COMPRESS_SETTING = 'compress answers';

/** Below this an answer goes as it is: compressing saves less than it costs (the middleware's rule). */
const MIN_BYTES = 1024;
/** Up to this an answer is compressed in one synchronous call; bigger ones stream through the middleware. */
const MAX_ONE_CALL_BYTES = 64 * 1024;

/**
 * negotiator 1.1.0 takes the server's preference for ties (`{ preferred }`), as the compression
 * middleware uses it; its published types predate that option, and a method with fewer parameters
 * fits this wider signature.
 */
interface EncodingNegotiator {
  encoding(available: readonly string[], options: { preferred: readonly string[] }): string | undefined;
}

/**
 * Sends a JSON answer, compressing one of up to 64 KB (a panel read, a record, a list) here in one
 * call. The compression middleware streams every answer through zlib's thread pool; for a 30 KB
 * panel read that cost ~0.8 ms of CPU per request against ~0.2 ms for one synchronous call
 * (`npm run bench:sync` part (g)). Same encodings and quality as the middleware (brotli 4 when the
 * client prefers or equally takes it, else gzip), with `Vary` and an exact Content-Length; the
 * middleware then leaves the answer alone (it is already encoded). Bigger answers (pull pages) keep
 * streaming, so no request blocks the event loop for long.
 */
export function sendJson(req: Request, res: Response, status: number, text: string): void {
  res.status(status).type('json');
  if (req.app.get(COMPRESS_SETTING) === false || req.method === 'HEAD') {
    res.send(text);
    return;
  }
  // encoded once: its length decides, and it is what gets compressed or sent
  const body = Buffer.from(text);
  if (body.length < MIN_BYTES || body.length > MAX_ONE_CALL_BYTES) {
    res.send(body);
    return;
  }
  res.vary('Accept-Encoding');
  const negotiator: EncodingNegotiator = new Negotiator(req);
  const encoding = negotiator.encoding(['br', 'gzip', 'identity'], { preferred: ['br', 'gzip'] });
  if (encoding !== 'br' && encoding !== 'gzip') {
    res.send(body);
    return;
  }
  const compressed =
    encoding === 'br'
      ? zlib.brotliCompressSync(body, {
          params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: body.length },
        })
      : zlib.gzipSync(body);
  res.setHeader('Content-Encoding', encoding);
  res.send(compressed);
}
