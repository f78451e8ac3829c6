/**
 * What a newcomer reads when `npm start` sets up a fresh database: the chores (scripts/db.ts)
 * log readable lines, not raw JSON, outside production; JSON lines when asked for (production's
 * default, for a log collector); and the demo sign-ins appear once (scripts/start.sh says them
 * beside the address, the seed chore does not say them again).
 */
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import { Client } from 'pg';
import { readConfig } from '../../server/config';
import { logFormatFor } from '../../server/logger';

const ROOT = path.resolve(__dirname, '..', '..');
const DB = `start_output_${process.pid}`;

function urlOf(database: string): string {
  const url = new URL(readConfig().DATABASE_URL);
  url.pathname = `/${database}`;
  return url.toString();
}

async function admin<T>(run: (c: Client) => Promise<T>): Promise<T> {
  const client = new Client({ connectionString: readConfig().DATABASE_URL });
  await client.connect();
  try {
    return await run(client);
  } finally {
    await client.end();
  }
}

/** One chore as start.sh runs it, with the environment a newcomer's shell gives it. */
function chore(command: string, env: Record<string, string | undefined>): string {
  const result = spawnSync(path.join(ROOT, 'node_modules', '.bin', 'tsx'), ['scripts/db.ts', command], {
    cwd: ROOT,
    env: { ...process.env, TSX_TSCONFIG_PATH: 'server/tsconfig.json', DATABASE_URL: urlOf(DB), LOG_LEVEL: 'info', ...env },
    encoding: 'utf8',
  });
  assert.equal(result.status, 0, result.stderr);
  return result.stdout + result.stderr;
}

const isJsonLine = (line: string) => {
  try {
    return typeof JSON.parse(line) === 'object';
  } catch {
    return false;
  }
};
const lines = (out: string) => out.split('\n').filter((l) => l.trim() !== '');

describe('npm start output', () => {
  before(() => admin((c) => c.query(`CREATE DATABASE ${DB}`)));
  after(() => admin((c) => c.query(`DROP DATABASE IF EXISTS ${DB} WITH (FORCE)`)));

  it('migrating and seeding a fresh database logs readable lines, and no sign-ins of its own', () => {
    const env = { NODE_ENV: 'development', LOG_FORMAT: undefined };
    const out = chore('migrate', env) + chore('seed-if-empty', env);
    assert.ok(lines(out).length >= 2, out);
    assert.deepEqual(lines(out).filter(isJsonLine), [], 'no raw JSON lines among the readable ones');
    assert.match(out, /migrated/);
    assert.match(out, /demo scenario loaded/);
    assert.doesNotMatch(out, /sign-ins/i, 'start.sh says the sign-ins once, beside the address');
  });

  it('JSON lines when asked for, for a log collector', () => {
    const out = chore('migrate', { NODE_ENV: 'development', LOG_FORMAT: 'json' });
    assert.ok(lines(out).length >= 1);
    for (const line of lines(out)) assert.ok(isJsonLine(line), line);
  });

  it('the format follows the environment unless LOG_FORMAT says otherwise; start.sh says the sign-ins once', () => {
    assert.equal(logFormatFor({ NODE_ENV: 'production', LOG_FORMAT: undefined }), 'json');
    assert.equal(logFormatFor({ NODE_ENV: 'development', LOG_FORMAT: undefined }), 'pretty');
    assert.equal(logFormatFor({ NODE_ENV: 'production', LOG_FORMAT: 'pretty' }), 'pretty');
    const start = fs.readFileSync(path.join(ROOT, 'scripts', 'start.sh'), 'utf8');
    assert.equal(start.match(/Demo sign-ins/g)?.length, 1);
  });
});
