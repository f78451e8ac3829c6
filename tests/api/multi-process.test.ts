/**
 * Two API processes of this checkout against one database and one object store, behind Debian's
 * nginx as the load balancer (started here on loopback; `npm test` installs it, scripts/lib.sh
 * ensure_nginx). Sessions live in PostgreSQL and photos in S3, so either process serves any
 * request: sign in through nginx, push on one and pull on the other, upload a photo on one and
 * read it on the other. Then one process gets SIGTERM while requests keep coming through nginx:
 * none may fail, the process finishes what it has, closes its pools and exits 0.
 */
import assert from 'node:assert/strict';
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION, type Mutation, type PullResponse, type PushResponse } from '../../shared/sync';
import { readConfig } from '../../server/config';
import { makeDataSource } from '../../server/data-source';
import { sha256Hex } from '../../server/services/photos';
import { stamp } from './context';
import { freePort, signInCookie, startServer, type ServerProcess } from './server-process';

const NGINX = ['/usr/sbin/nginx', '/usr/bin/nginx'].find((p) => fs.existsSync(p));
const DEVICE = 'multi-process-test';
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * The load balancer's configuration: what a production nginx in front of N processes needs, in a
 * private prefix (pid, logs, temp files) so that it runs as an ordinary foreground process.
 */
function nginxConf(prefix: string, listen: number, upstreams: number[]): string {
  return `daemon off;
worker_processes 1;
pid ${prefix}/nginx.pid;
error_log ${prefix}/error.log warn;
events { worker_connections 256; }
http {
  access_log ${prefix}/access.log;
  client_body_temp_path ${prefix}/client_body;
  proxy_temp_path ${prefix}/proxy;
  fastcgi_temp_path ${prefix}/fastcgi;
  uwsgi_temp_path ${prefix}/uwsgi;
  scgi_temp_path ${prefix}/scgi;
  client_max_body_size 16m;

  upstream ampwright_api {
${upstreams.map((p) => `    server 127.0.0.1:${p} max_fails=1 fail_timeout=5s;`).join('\n')}
    keepalive 16;
    # shorter than the API's keep-alive (server/index.ts): nginx, not the API, drops idle connections
    keepalive_timeout 30s;
  }

  server {
    listen 127.0.0.1:${listen};
    proxy_http_version 1.1;
    proxy_set_header Connection "";
    proxy_set_header Host $host;
    proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
    proxy_set_header X-Forwarded-Proto $scheme;
    # a process that is gone or stopping: try the next one. nginx does this for GET, PUT and DELETE
    proxy_next_upstream error timeout http_502 http_503;
    proxy_next_upstream_tries 3;

    location / {
      proxy_pass http://ampwright_api;
    }
    # sync may be replayed on another process even after it was sent (non_idempotent): a push is
    # idempotent by its mutation ids (the processed_mutation guard answers a replay 'duplicate'),
    # a pull only reads. Other POSTs (sign-in, invitations, reports) are not retried once sent.
    location /api/sync/ {
      proxy_pass http://ampwright_api;
      proxy_next_upstream error timeout http_502 http_503 non_idempotent;
    }
  }
}
`;
}

describe('two API processes behind nginx', () => {
  let a: ServerProcess;
  let b: ServerProcess;
  let nginx: ChildProcess;
  let prefix: string;
  let lb: string;
  let cookie: string;
  let ds: DataSource;

  before(async () => {
    if (!NGINX) throw new Error("nginx is missing: `npm test` installs Debian's (scripts/lib.sh ensure_nginx)");
    ds = await makeDataSource(readConfig().DATABASE_URL).initialize();
    [a, b] = await Promise.all([startServer(), startServer()]);
    prefix = fs.mkdtempSync(path.join(os.tmpdir(), 'ampwright-nginx-'));
    // as root nginx's worker runs as nobody, and must reach the temp folders
    fs.chmodSync(prefix, 0o755);
    // the port asked for (AMPWRIGHT_TEST_NGINX_PORT), else one the kernel says is free; a port
    // taken meanwhile (a client's outgoing connection can hold any port of the ephemeral range)
    // makes nginx give up binding it: then try another
    let port = Number(process.env.AMPWRIGHT_TEST_NGINX_PORT) || (await freePort());
    for (let attempt = 1; ; attempt++) {
      if (await startNginx(port)) break;
      const log = fs.readFileSync(`${prefix}/error.log`, 'utf8');
      if (attempt === 3 || !/Address already in use/.test(log)) assert.fail(`nginx did not start:\n${log}`);
      port = await freePort();
    }
    lb = `http://127.0.0.1:${port}`;
    cookie = await signInCookie(lb, 'admin');
  });

  /** nginx on `port` in front of A and B: true once it answers through to an API process. */
  async function startNginx(port: number): Promise<boolean> {
    fs.writeFileSync(path.join(prefix, 'nginx.conf'), nginxConf(prefix, port, [a.port, b.port]));
    fs.writeFileSync(path.join(prefix, 'error.log'), '');
    const started = spawn(NGINX as string, ['-e', `${prefix}/error.log`, '-p', prefix, '-c', `${prefix}/nginx.conf`], {
      stdio: ['ignore', 'ignore', 'inherit'],
    });
    const exited = new Promise<void>((resolve) => started.once('exit', () => resolve()));
    for (let i = 0; i < 100 && started.exitCode === null; i++) {
      // the pid file is written once nginx holds the port: before that, whatever answers is not it
      if (fs.existsSync(`${prefix}/nginx.pid`)) {
        try {
          if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) {
            nginx = started;
            return true;
          }
        } catch {
          // not serving yet
        }
      }
      await sleep(100);
    }
    if (started.exitCode === null) started.kill('SIGTERM');
    await exited;
    return false;
  }

  after(async () => {
    if (nginx && nginx.exitCode === null) {
      const gone = new Promise((r) => nginx.once('exit', r));
      nginx.kill('SIGTERM');
      await gone;
    }
    await Promise.all([a?.stop(), b?.stop()]);
    await ds?.destroy();
    if (prefix) fs.rmSync(prefix, { recursive: true, force: true });
  });

  const call = (base: string, method: string, route: string, body?: unknown) =>
    fetch(`${base}/api${route}`, {
      method,
      headers: { cookie, ...(body !== undefined && { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  const mutation = (name: Mutation['name'], buildingId: string, entityId: string, fields: Record<string, unknown>, extra: Partial<Mutation> = {}): Mutation => ({
    id: uuidv7(),
    name,
    buildingId,
    entityId,
    baseVersion: 0,
    hlc: stamp(DEVICE),
    fields,
    ...extra,
  });
  async function push(base: string, ...mutations: Mutation[]) {
    const res = await call(base, 'POST', '/sync/push', { deviceId: DEVICE, schemaVersion: SCHEMA_VERSION, mutations });
    const body = (await res.json()) as PushResponse;
    assert.equal(res.status, 200, JSON.stringify(body));
    return body.results;
  }
  async function pull(base: string) {
    const res = await call(base, 'POST', '/sync/pull', { deviceId: DEVICE, schemaVersion: SCHEMA_VERSION, cursors: {} });
    assert.equal(res.status, 200);
    return (await res.json()) as PullResponse;
  }
  /** A building made by push on `base`, with a panel. */
  async function newBuilding(base: string, name: string) {
    const buildingId = uuidv7();
    const panelId = uuidv7();
    const results = await push(
      base,
      mutation('building.create', buildingId, buildingId, { name }),
      mutation('panel.create', buildingId, panelId, { tag: 'M1', system: '208Y/120V-3ph-4w', busRatingA: 225, spaces: 42 }, { parentId: buildingId }),
    );
    assert.deepEqual(results.map((r) => r.status), ['applied', 'applied'], JSON.stringify(results));
    return { buildingId, panelId, version: results[1].version ?? 0 };
  }

  it('shares sessions, writes and photos between the processes', async () => {
    // the session made through nginx is good on both processes
    for (const server of [a, b]) assert.equal((await call(server.url, 'GET', '/me')).status, 200);

    // pushed on A, pulled on B
    const { buildingId, panelId } = await newBuilding(a.url, 'Two-process depot');
    const page = (await pull(b.url)).buildings.find((p) => p.buildingId === buildingId);
    assert.ok(page, 'the building pushed on A comes down from B');
    assert.equal(page.building?.name, 'Two-process depot');

    // a photo uploaded on A is served by B
    const deficiencyId = uuidv7();
    const bytes = await sharp({ create: { width: 640, height: 480, channels: 3, background: { r: 200, g: 90, b: 40 } } })
      .jpeg()
      .toBuffer();
    const photoId = uuidv7();
    const results = await push(
      a.url,
      mutation('deficiency.create', buildingId, deficiencyId, { title: 'Loose neutral', priority: 2, panelId }),
      mutation('photo.create', buildingId, photoId, {
        parentKind: 'deficiency',
        parentId: deficiencyId,
        purpose: 'finding',
        sha256: sha256Hex(bytes),
        bytes: bytes.length,
        contentType: 'image/jpeg',
        takenAt: new Date().toISOString(),
      }),
    );
    assert.deepEqual(results.map((r) => r.status), ['applied', 'applied'], JSON.stringify(results));
    const form = new FormData();
    form.append('photo', new Blob([bytes], { type: 'image/jpeg' }), 'photo.jpg');
    const put = await fetch(`${a.url}/api/photos/${photoId}`, {
      method: 'PUT',
      headers: { cookie, 'x-content-sha256': sha256Hex(bytes) },
      body: form,
    });
    assert.equal(put.status, 200, await put.clone().text());
    const original = await call(b.url, 'GET', `/photos/${photoId}`);
    assert.equal(original.status, 200);
    assert.equal(original.headers.get('content-type'), 'image/jpeg');
    const served = await sharp(Buffer.from(await original.arrayBuffer())).metadata();
    assert.deepEqual([served.width, served.height], [640, 480]);
    assert.equal((await call(b.url, 'GET', `/photos/${photoId}/thumb`)).status, 200);
  });

  it('loses no request through nginx when one process stops (SIGTERM), and that process closes its pools', async (t) => {
    const connectionsOf = async (server: ServerProcess): Promise<number> => {
      const [{ n }] = await ds.query('SELECT count(*)::int AS n FROM pg_stat_activity WHERE application_name = $1', [
        `ampwright:${server.child.pid}`,
      ]);
      return n;
    };
    // both processes hold connections of both pools (each names them after its pid)
    for (let i = 0; i < 6; i++) assert.equal((await call(lb, 'GET', '/buildings')).status, 200);
    assert.ok((await connectionsOf(a)) > 0, 'A is connected to PostgreSQL under its name');

    // four clients, each with a building of its own, editing and syncing without a pause
    const workers = await Promise.all([0, 1, 2, 3].map((w) => newBuilding(lb, `Load building ${w}`)));
    const failures: string[] = [];
    const counts = { requests: 0, pushes: 0 };
    /** requests each client has finished: the phases below wait on these, not on the clock */
    const done = [0, 0, 0, 0];
    const allDid = async (n: number[]) => {
      while (done.some((d, w) => d < n[w])) await sleep(20);
    };
    let running = true;
    const work = async (w: number) => {
      let version = workers[w].version;
      // as a device does: the next pull asks only for what changed since the last one
      const cursors: Record<string, number> = {};
      for (let i = 0; running; i++) {
        const step = i % 3;
        const what = ['GET /api/me', 'POST /api/sync/push', 'POST /api/sync/pull'][step];
        try {
          if (step === 0) {
            const res = await call(lb, 'GET', '/me');
            if (res.status !== 200) failures.push(`${what}: ${res.status} ${await res.text()}`);
          } else if (step === 1) {
            const m = mutation('building.patch', workers[w].buildingId, workers[w].buildingId, { notes: `edit ${i}` }, {
              baseVersion: version,
              hlc: stamp(`${DEVICE}-${w}`),
            });
            const res = await call(lb, 'POST', '/sync/push', { deviceId: `${DEVICE}-${w}`, schemaVersion: SCHEMA_VERSION, mutations: [m] });
            const body = (await res.json()) as PushResponse;
            const result = body.results?.[0];
            // 'duplicate' would be nginx replaying a push that went through: the same outcome
            if (res.status !== 200 || !result || !['applied', 'duplicate'].includes(result.status)) {
              failures.push(`${what}: ${res.status} ${JSON.stringify(body)}`);
            } else {
              version = result.version ?? version;
              counts.pushes += 1;
            }
          } else {
            const res = await call(lb, 'POST', '/sync/pull', { deviceId: `${DEVICE}-${w}`, schemaVersion: SCHEMA_VERSION, cursors });
            if (res.status !== 200) failures.push(`${what}: ${res.status} ${await res.text()}`);
            else for (const page of ((await res.json()) as PullResponse).buildings) cursors[page.buildingId] = page.toVersion;
          }
        } catch (error) {
          failures.push(`${what}: no answer (${(error as Error).message})`);
        }
        counts.requests += 1;
        done[w] += 1;
      }
    };
    const clients = workers.map((_, w) => work(w));
    try {
      // every client is under way (pushes included), then A is told to stop mid-stream
      await allDid([3, 3, 3, 3]);
      const atStop = counts.requests;
      const exit = await a.stop('SIGTERM');
      t.diagnostic(`A stopped after ${counts.requests - atStop} more requests through nginx`);
      assert.equal(exit, 0, `A's exit after SIGTERM:\n${a.output().slice(-3000)}`);
      // and on with one process left: each client makes two full rounds more
      await allDid(done.map((d) => d + 6));
    } finally {
      running = false;
      await Promise.all(clients);
    }
    t.diagnostic(`${counts.requests} requests (${counts.pushes} pushes) through nginx, ${failures.length} failed`);
    assert.deepEqual(failures, [], `${failures.length} of ${counts.requests} requests failed`);

    // A let go of every connection before it exited
    for (let i = 0; i < 20 && (await connectionsOf(a)) > 0; i++) await sleep(100);
    assert.equal(await connectionsOf(a), 0, 'A left connections open');
    assert.equal((await call(lb, 'GET', '/me')).status, 200, 'B serves on');
  });
});
