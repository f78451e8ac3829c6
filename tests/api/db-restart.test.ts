/**
 * The API process outlives a PostgreSQL restart. A real `server/index.ts` runs against the test
 * cluster with a signed-in user and a light, steady load; the cluster is stopped with
 * `pg_ctl -m immediate` (every connection dropped at once, as a crash or a failover does), checked
 * while down, and started again. The same process must stay up, answer 503 + Retry-After while the
 * database is away (the client keeps its changes queued on a 5xx) and serve the same session after.
 */
import assert from 'node:assert/strict';
import { execFile } from 'node:child_process';
import { after, before, describe, it } from 'node:test';
import { promisify } from 'node:util';
import type { DataSource } from 'typeorm';
import { SCHEMA_VERSION } from '../../shared/sync';
import { readConfig } from '../../server/config';
import { makeDataSource } from '../../server/data-source';
import { ROOT, signInCookie, startServer, type ServerProcess } from './server-process';

const run = promisify(execFile);

/** pg_ctl on the test cluster, through scripts/lib.sh (as root it runs as the postgres user). */
async function pgCtl(dataDir: string, ...args: string[]): Promise<void> {
  await run(
    'bash',
    ['-c', 'source scripts/lib.sh && pg_run "$(pg_bindir)/pg_ctl" -D "$1" "${@:2}"', 'pg_ctl', dataDir, ...args],
    { cwd: ROOT },
  );
}
async function clusterUp(dataDir: string): Promise<boolean> {
  try {
    await pgCtl(dataDir, 'status');
    return true;
  } catch {
    return false;
  }
}
/** Start with the options of the last start (postmaster.opts): pg_ctl restart does that, running or not. */
async function startCluster(dataDir: string): Promise<void> {
  await pgCtl(dataDir, '-l', `${dataDir}/server.log`, '-w', '-t', '60', 'restart');
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('a PostgreSQL restart under load', () => {
  let server: ServerProcess;
  let cookie: string;
  let dataDir: string;

  before(async () => {
    const ds: DataSource = await makeDataSource(readConfig().DATABASE_URL).initialize();
    [{ data_directory: dataDir }] = await ds.query('SHOW data_directory');
    await ds.destroy();
    server = await startServer();
    cookie = await signInCookie(server.url, 'electrician');
  });

  after(async () => {
    await server?.stop();
    // the suites after this one need the cluster, whatever happened here
    if (dataDir && !(await clusterUp(dataDir))) await startCluster(dataDir);
  });

  it('keeps the process up, answers 503 with Retry-After while down, and serves the same session after', async () => {
    const get = (path: string) => fetch(`${server.url}${path}`, { headers: { cookie } });
    const pull = () =>
      fetch(`${server.url}/api/sync/pull`, {
        method: 'POST',
        headers: { cookie, 'content-type': 'application/json' },
        body: JSON.stringify({ deviceId: 'restart-test-device', schemaVersion: SCHEMA_VERSION, cursors: {} }),
      });
    // connections in both pools (the session store's and TypeORM's) sit idle when the database goes
    for (let i = 0; i < 5; i++) assert.equal((await get('/api/buildings')).status, 200);
    assert.equal((await pull()).status, 200, 'a pull before the restart');

    // light load all through: two requests at a time, one after another
    const statuses = new Map<number | string, number>();
    let loading = true;
    const load = async () => {
      while (loading) {
        let status: number | string;
        try {
          status = (await get(Math.random() < 0.5 ? '/api/me' : '/api/buildings')).status;
        } catch (error) {
          status = `no answer (${(error as Error).message})`;
        }
        statuses.set(status, (statuses.get(status) ?? 0) + 1);
        await sleep(20);
      }
    };
    const loaders = [load(), load()];

    try {
      await sleep(300);
      await pgCtl(dataDir, '-m', 'immediate', '-w', 'stop');
      try {
        // let the pools notice their connections are gone
        await sleep(1000);
        assert.equal(server.child.exitCode, null, `the API process died:\n${server.output().slice(-3000)}`);
        const calls = { 'GET /api/me': () => get('/api/me'), 'GET /api/buildings': () => get('/api/buildings'), 'POST /api/sync/pull': pull };
        for (const [path, call] of Object.entries(calls)) {
          const res = await call();
          assert.equal(res.status, 503, `${path} while the database is down`);
          assert.equal(res.headers.get('retry-after'), '5', `${path}: Retry-After`);
          const body = (await res.json()) as { error: { code: string } };
          assert.equal(body.error.code, 'database_unavailable', path);
        }
      } finally {
        await startCluster(dataDir);
      }

      // back by itself: the same process, the same cookie
      let status = 0;
      for (let i = 0; i < 60 && status !== 200; i++) {
        status = (await get('/api/me')).status;
        if (status !== 200) await sleep(250);
      }
      assert.equal(status, 200, `no signed-in answer after the restart:\n${server.output().slice(-3000)}`);
    } finally {
      loading = false;
      await Promise.all(loaders);
    }
    assert.equal(server.child.exitCode, null);
    const me = (await (await get('/api/me')).json()) as { user: { email: string } };
    assert.equal(me.user.email, 'electrician@ampwright.test');

    // under load only answers came back, and no 500: 200 while up, 503 while down
    const seen = [...statuses.keys()].sort().join(', ');
    for (const key of statuses.keys()) assert.ok(key === 200 || key === 503, `unexpected answer ${key} (saw ${seen})`);
    assert.ok(statuses.get(503), `no 503 seen under load (saw ${seen})`);
  });
});
