/**
 * The sync kernel's kind table and its set-wise merge of record kinds (server/sync/): every
 * mutation name has one handler, and a run of patches of one kind costs a constant number of
 * statements however long it is (the statement count of a push is counted on its query runner).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { uuidv7 } from 'uuidv7';
import { MUTATION_NAMES, SCHEMA_VERSION, type Mutation, type PushResponse } from '../../shared/sync';
import { loadActor, type Actor } from '../../server/auth/access';
import { applyPush } from '../../server/sync/push';
import { MUTATION_HANDLERS } from '../../server/sync/kinds';
import { demoIds, stamp, startApp, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let inspector: Actor;
let electrician: Actor;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  const [row] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'inspector@ampwright.test'`);
  inspector = await loadActor(ctx.ds.manager, row.id);
  const [sparky] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
  electrician = await loadActor(ctx.ds.manager, sparky.id);
});
after(() => ctx.close());

function m(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, baseVersion = 0): Mutation {
  return { id: uuidv7(), name, buildingId: ids.clinicId, entityId, baseVersion, hlc: stamp('kinds'), fields };
}

/** Apply a push in its own transaction and count the statements it sent (and list them). */
async function countedPush(
  mutations: Mutation[],
  actor = inspector,
): Promise<{ body: PushResponse; statements: number; sent: string[] }> {
  const runner = ctx.ds.createQueryRunner();
  let statements = 0;
  const sent: string[] = [];
  const query = runner.query.bind(runner);
  runner.query = ((...args: Parameters<typeof query>) => {
    statements++;
    sent.push(String(args[0]).replace(/\s+/g, ' ').trim().slice(0, 60));
    return query(...args);
  }) as typeof runner.query;
  try {
    await runner.startTransaction();
    const body = await applyPush(runner.manager, actor, { deviceId: 'kinds', schemaVersion: SCHEMA_VERSION, mutations });
    await runner.commitTransaction();
    return { body, statements, sent };
  } catch (error) {
    await runner.rollbackTransaction();
    throw error;
  } finally {
    await runner.release();
  }
}

async function raise(count: number): Promise<string[]> {
  const made = Array.from({ length: count }, () => uuidv7());
  const { body } = await countedPush(
    made.map((id, i) => m('deficiency.create', id, { title: `Kind test ${i}`, priority: 3, panelId: ids.clinicLAId })),
  );
  assert.deepEqual(new Set(body.results.map((r) => r.status)), new Set(['applied']), JSON.stringify(body.results));
  return made;
}

describe('the kind table', () => {
  it('has exactly one handler for every mutation name of the contract', () => {
    assert.deepEqual(Object.keys(MUTATION_HANDLERS).sort(), [...MUTATION_NAMES].sort());
    for (const name of MUTATION_NAMES) assert.equal(typeof MUTATION_HANDLERS[name], 'function', name);
  });
});

describe('a run of record patches merges set-wise', () => {
  it('60 deficiency patches cost no more statements than 6, with a history line each', async () => {
    const made = await raise(60);
    const patches = (n: number, tag: string) =>
      made.slice(0, n).map((id, i) => m('deficiency.patch', id, { title: `Edited ${tag} ${i}`, description: tag }));
    const few = await countedPush(patches(6, 'few'));
    const many = await countedPush(patches(60, 'many'));
    for (const run of [few, many]) {
      assert.deepEqual(new Set(run.body.results.map((r) => r.status)), new Set(['applied']), JSON.stringify(run.body.results));
    }
    assert.ok(many.statements <= few.statements, `60 patches took ${many.statements} statements, 6 took ${few.statements}`);
    const rows = await ctx.ds.query(`SELECT id, title, description FROM deficiency WHERE id = ANY($1::uuid[])`, [made]);
    assert.equal(rows.filter((r: { description: string }) => r.description === 'many').length, 60);
    const entries = await ctx.ds.query(
      `SELECT deficiency_id, changes FROM deficiency_entry WHERE deficiency_id = ANY($1::uuid[]) AND kind = 'change' AND text = ''`,
      [made],
    );
    // one change line per patch that changed something: 6 + 60
    assert.equal(entries.length, 66);
    const last = entries.find((e: { changes: Record<string, unknown> }) => JSON.stringify(e.changes).includes('Edited many 0'));
    assert.ok(last, 'the change line records the new title');
  });

  it('a rule still holds inside the run: a forbidden change is rejected, the rest applies', async () => {
    const made = await raise(3);
    const { body } = await countedPush([
      m('deficiency.patch', made[0], { title: 'Still fine' }),
      // an inspector cannot mark a repair done (shared/permissions.ts)
      m('deficiency.patch', made[1], { status: 'repaired', repairNote: 'tightened' }),
      m('deficiency.patch', made[2], { priority: 1, priorityReason: 'worse than it looked' }),
    ]);
    assert.deepEqual(body.results.map((r) => r.status), ['applied', 'rejected', 'applied']);
    assert.match(body.results[1].reason ?? '', /Inspectors cannot mark a repair done/);
    const [moved] = await ctx.ds.query(`SELECT priority, due_on FROM deficiency WHERE id = $1`, [made[2]]);
    assert.equal(moved.priority, 1);
  });
});

/** The clinic's version: a device that has pulled everything edits from it (no conflict). */
async function buildingVersion(): Promise<number> {
  const [row] = await ctx.ds.query(`SELECT version FROM building WHERE id = $1`, [ids.clinicId]);
  return Number(row.version);
}

describe('a push goes to the database in few round trips', () => {
  it('a run of circuit patches: the replay read with the building lock, the savepoint, the merge with its claim, the release', async () => {
    const circuits = await Promise.all([3, 5, 7, 9].map((position) => ids.circuitAt(ids.clinicLAId, position)));
    const seen = await buildingVersion();
    const run = circuits.map((id, i) => m('circuit.patch', id, { notes: `Round trip ${i}` }, seen));
    const first = await countedPush(run, electrician);
    assert.deepEqual(first.body.results.map((r) => r.status), ['applied', 'applied', 'applied', 'applied']);
    // those four, and START TRANSACTION and COMMIT around them: six (the replay read and the claim
    // were once statements of their own: eight)
    assert.equal(first.statements, 6, first.sent.join('\n'));
    const claims = await ctx.ds.query(`SELECT result FROM processed_mutation WHERE mutation_id = ANY($1::uuid[])`, [run.map((x) => x.id)]);
    assert.deepEqual(claims.map((c: { result: unknown }) => c.result), first.body.results.map(({ status, version }) => ({ status, version })));
    // the same push again: every one a duplicate, and the building is neither locked nor bumped
    const before = await buildingVersion();
    const again = await countedPush(run, electrician);
    assert.deepEqual(again.body.results.map((r) => r.status), ['duplicate', 'duplicate', 'duplicate', 'duplicate']);
    assert.equal(await buildingVersion(), before);
  });
});

describe('storage', () => {
  it('every synced table compresses its field stamps with lz4, and a merged row is stored so', async () => {
    // field_meta is rewritten (and so compressed again) by every merge: lz4 does it several times
    // faster than PostgreSQL's default pglz
    const columns: { table_name: string; method: string }[] = await ctx.ds.query(
      `SELECT c.relname AS table_name, a.attcompression AS method
         FROM pg_attribute a JOIN pg_class c ON c.oid = a.attrelid JOIN pg_namespace n ON n.oid = c.relnamespace
        WHERE a.attname = 'field_meta' AND c.relkind = 'r' AND n.nspname = current_schema()
        ORDER BY 1`,
    );
    assert.ok(columns.length >= 10, `synced tables: ${columns.map((c) => c.table_name).join(', ')}`);
    assert.deepEqual(columns.filter((c) => c.method !== 'l'), [], 'tables whose field_meta is not lz4');
    const id = await ids.circuitAt(ids.clinicLAId, 11);
    const { body } = await countedPush([m('circuit.patch', id, { notes: 'Stored with lz4' }, await buildingVersion())], electrician);
    assert.equal(body.results[0].status, 'applied');
    const [row] = await ctx.ds.query(
      `SELECT pg_column_compression(field_meta) AS method, octet_length(field_meta::text) AS length FROM circuit WHERE id = $1`,
      [id],
    );
    // a demo circuit carries a stamp for each of its fields, enough for PostgreSQL to compress the
    // row (past about 2 kB); a value it did not compress would have no method
    assert.ok(row.length > 1000, `field_meta of ${row.length} characters`);
    assert.equal(row.method, 'lz4');
  });
});
