/**
 * Parts (e)–(g) of `npm run bench:sync`: what goes over a weak signal and how fast the panel read
 * answers. Helpers only; bench-sync.ts owns the data and prints the figures.
 */
import { spawn } from 'node:child_process';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';
import { chromium } from '@playwright/test';
import express from 'express';

/** An HTTP server of ours listening on a free loopback port, and how to stop it. */
export async function listen(app: express.Express): Promise<{ baseUrl: string; close(): Promise<void> }> {
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/**
 * (e) Bytes on the wire (headers + encoded bodies, as Chromium's network layer counts them) for a
 * first visit to the sign-in page in a fresh profile, until the form shows and the network is idle.
 */
export async function firstLoadBytes(baseUrl: string): Promise<{ bytes: number; requests: number; scriptBytes: number }> {
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    const types = new Map<string, string>();
    let bytes = 0;
    let scriptBytes = 0;
    let requests = 0;
    cdp.on('Network.responseReceived', (e) => types.set(e.requestId, e.type));
    cdp.on('Network.loadingFinished', (e) => {
      bytes += e.encodedDataLength;
      requests++;
      if (types.get(e.requestId) === 'Script') scriptBytes += e.encodedDataLength;
    });
    await page.goto(baseUrl, { waitUntil: 'networkidle' });
    await page.getByTestId('sign-in-email').waitFor({ timeout: 60_000 });
    await page.waitForLoadState('networkidle');
    return { bytes, requests, scriptBytes };
  } finally {
    await browser.close();
  }
}

/** One POST with a JSON body, read raw: what crossed the wire, and the decoded JSON. */
export function postRaw(
  url: string,
  body: unknown,
  headers: Record<string, string>,
): Promise<{ wireBytes: number; jsonBytes: number; encoding: string; json: unknown }> {
  return new Promise((resolve, reject) => {
    const payload = JSON.stringify(body);
    const req = http.request(url, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload), ...headers },
    });
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const raw = Buffer.concat(chunks);
        const encoding = String(res.headers['content-encoding'] ?? 'identity');
        const text = (encoding === 'br' ? zlib.brotliDecompressSync(raw) : encoding === 'gzip' ? zlib.gunzipSync(raw) : raw).toString();
        if (res.statusCode !== 200) return reject(new Error(`${url}: ${res.statusCode} ${text.slice(0, 200)}`));
        resolve({ wireBytes: raw.length, jsonBytes: Buffer.byteLength(text), encoding, json: JSON.parse(text) });
      });
    });
    req.on('error', reject);
    req.end(payload);
  });
}

/** The session cookie of a sign-in. */
export async function signInCookie(baseUrl: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

/**
 * (g) Requests per second of a GET under autocannon, run as its own process so that it does not
 * share the event loop of the server it measures (which runs in this one).
 */
export function requestsPerSecond(url: string, headers: Record<string, string> = {}, seconds = 5): Promise<number> {
  const bin = path.resolve(__dirname, '..', 'node_modules', '.bin', 'autocannon');
  const args = ['-j', '-c', '10', '-d', String(seconds), ...Object.entries(headers).flatMap(([k, v]) => ['-H', `${k}=${v}`]), url];
  return new Promise((resolve, reject) => {
    const child = spawn(bin, args, { stdio: ['ignore', 'pipe', 'inherit'] });
    let out = '';
    child.stdout.on('data', (c: Buffer) => (out += c.toString()));
    child.on('error', reject);
    child.on('close', (code) => {
      if (code !== 0) return reject(new Error(`autocannon exited with ${code}`));
      const result = JSON.parse(out) as { requests: { average: number }; non2xx: number; errors: number };
      if (result.non2xx > 0 || result.errors > 0) {
        return reject(new Error(`autocannon: ${result.non2xx} non-2xx answers, ${result.errors} errors on ${url}`));
      }
      resolve(result.requests.average);
    });
  });
}

/** The bare Express answer the panel read is compared with: the same machine, the same moment. */
export function helloWorld(): express.Express {
  const app = express();
  app.get('/', (_req, res) => {
    res.send('hello');
  });
  return app;
}
