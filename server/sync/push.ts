import type { DataSource, EntityManager } from 'typeorm';
import type { Mutation, MutationName, MutationResult, PullBody, PullResponse, PushResponse } from '../../shared/sync';
import type { Actor } from '../auth/access';
import { AppError } from '../http/errors';
import { logger } from '../logger';
import { observeStamp, serverStamp } from '../services/clock';
import { VersionBook, writeContext, type WriteContext } from './context';
import {
  isDeterministicDbError,
  prepare,
  rejection,
  requireSchemaVersion,
  stampFor,
  type Checked,
  type Prepared,
  type PushInput,
  type StoredResult,
} from './envelope';
import { MUTATION_HANDLERS, PATCH_PLANNERS, plansRuns } from './kinds';
import type { PatchItem, PatchPlan } from './kinds/types';
import { pullPages } from './pull';
import { byClaim, checkFinal, ReplayRecord, STILL_PROCESSING } from './replays';

/**
 * The server side of offline sync (SYNC.md).
 *
 * Push: one transaction. The buildings the mutations name (where the user may edit, and not only
 * for replayed mutations) are locked in id order and bumped once each before anything is applied,
 * so every row a push touches in a building carries that one new version: one bump per building
 * per push, not per mutation (a building whose mutations all get rejected gets an empty version,
 * which costs nothing). Then each mutation is applied in order in its own savepoint, whose first
 * statement claims its id in processed_mutation (ON CONFLICT DO NOTHING RETURNING; nothing
 * returned means a replay, answered from the record as `duplicate`).
 *
 * Runs of consecutive patches of one kind (`circuit.patch`, `deficiency.patch`, …: the names
 * with a planner in kinds/index.ts PATCH_PLANNERS) are one batch in one savepoint, with a
 * constant number of statements however long the run:
 * - patches of free fields only (description, notes, load …: no rule ties them to other fields),
 *   one per circuit, are merged inside one UPDATE statement (setwise-circuit.ts),
 *   which hands back every field decision with the stored stamp and old value, so conflicts and
 *   per-mutation results come from the same shared/merge.ts rule;
 * - any other run is read under the building locks and merged and validated in memory, in order,
 *   then written with one UPDATE … FROM unnest (kinds/circuit-batch.ts, kinds/record.ts).
 * Either way one statement then claims all the run's ids with their results (for the free-field
 * circuit run, the merge statement itself: PatchPlan.claims). Same per-mutation
 * results, idempotency and conflicts as the one-by-one path; if a claim is lost (only possible for
 * an id reused across buildings, since pushes to one building queue on its lock) the batch is
 * rolled back and planned again, and on a database error it is replayed one mutation per
 * savepoint.
 *
 * Pull: server/sync/pull.ts (one REPEATABLE READ transaction, pages cut by row).
 */

class Push {
  readonly results: MutationResult[] = [];
  /** answers recorded so far for this device: before this push, and by it */
  private readonly known = new Map<string, StoredResult>();
  readonly versions: VersionBook;
  private readonly replays: ReplayRecord;
  private readonly now = Date.now();

  constructor(
    private readonly em: EntityManager,
    private readonly actor: Actor,
    private readonly deviceId: string,
  ) {
    this.versions = new VersionBook(em);
    this.replays = new ReplayRecord(em, deviceId, actor.userId);
  }

  private context(mutation: Mutation): WriteContext {
    return writeContext(this.em, this.actor, stampFor(mutation, this.deviceId, this.now), this.deviceId, {
      versions: this.versions,
      sync: { mutationId: mutation.id, baseVersion: mutation.baseVersion, buildingId: mutation.buildingId },
    });
  }

  private finish(mutation: Mutation, w: WriteContext): StoredResult {
    observeStamp(w.hlc);
    const conflictIds = w.report.conflictIds;
    return {
      status: conflictIds.length > 0 ? 'conflict' : 'applied',
      version: this.versions.peek(mutation.buildingId) ?? 0,
      ...(conflictIds.length > 0 && { conflictIds }),
    };
  }

  /**
   * Lock and bump, in id order, the buildings this push may change, skipping mutations answered
   * before. One statement: the answers already recorded for this device are read first (from the
   * statement's snapshot, before any lock: a batch that then loses a claim re-reads, see batch()),
   * and only the buildings of mutations not answered yet are locked and bumped, so a replayed push
   * bumps nothing. Only buildings of the user's organisations (every role writes something: owners
   * defer and comment, inspectors record); a mutation the role may not make is rejected later.
   */
  async lockBuildings(prepared: Prepared[]): Promise<void> {
    const valid = prepared.filter((p): p is Extract<Prepared, { ok: true }> => p.ok);
    if (valid.length === 0) return;
    const rows: { answered: boolean; id: string; result: StoredResult | null; organisation_id: string; version: string }[] =
      await this.em.query(
        `WITH done AS (
           SELECT mutation_id, result FROM processed_mutation
            WHERE user_id = $3 AND device_id = $1 AND mutation_id = ANY($2::uuid[])
         ), wanted AS (
           SELECT m.b FROM unnest($2::uuid[], $4::uuid[]) AS m(id, b)
            WHERE NOT EXISTS (SELECT 1 FROM done WHERE done.mutation_id = m.id)
         ), locked AS (
           UPDATE building SET version = version + 1
            WHERE id IN (SELECT id FROM building
                          WHERE id IN (SELECT b FROM wanted) AND organisation_id = ANY($5::uuid[])
                          ORDER BY id FOR UPDATE)
           RETURNING id, organisation_id, version
         )
         SELECT true AS answered, mutation_id AS id, result, NULL::uuid AS organisation_id, NULL::bigint AS version FROM done
         UNION ALL
         SELECT false, id, NULL, organisation_id, version FROM locked`,
        [this.deviceId, valid.map((p) => p.id), this.actor.userId, valid.map((p) => p.mutation.buildingId), [...this.actor.roles.keys()]],
      );
    for (const row of rows) if (row.answered) this.known.set(row.id, row.result ?? STILL_PROCESSING);
    this.versions.adopt(rows.filter((row) => !row.answered));
  }

  /** Apply every mutation in order; runs of patches of one kind as one batch. */
  async run(prepared: Prepared[]): Promise<void> {
    for (let i = 0; i < prepared.length; ) {
      const name = nameOf(prepared[i]);
      let end = i;
      while (end < prepared.length && plansRuns(name) && nameOf(prepared[end]) === name) end++;
      if (end - i >= 2) {
        await this.batch(prepared.slice(i, end));
        i = end;
      } else {
        this.results.push(await this.single(prepared[i]));
        i++;
      }
    }
  }

  private static duplicate(id: string, stored: StoredResult): MutationResult {
    const { status, ...rest } = stored;
    return { ...rest, id, status: 'duplicate', originalStatus: status as 'applied' | 'conflict' | 'rejected' };
  }

  /** One mutation in its own savepoint: claim, apply, record; a rejection rolls the savepoint back. */
  private async single(p: Prepared): Promise<MutationResult> {
    const saved = this.versions.entries();
    await this.em.query('SAVEPOINT m');
    try {
      const claimed = await this.replays.claim([p.id]);
      if (!claimed.has(p.id)) {
        await this.em.query('RELEASE SAVEPOINT m');
        return Push.duplicate(p.id, (await this.replays.stored([p.id])).get(p.id)!);
      }
      let result: StoredResult;
      if (!p.ok) {
        result = { status: 'rejected', version: 0, reason: p.reason, ...(p.fields && { fields: p.fields }) };
      } else {
        const w = this.context(p.mutation);
        await apply(w, p);
        result = this.finish(p.mutation, w);
      }
      await this.replays.record([{ id: p.id, result }]);
      await this.em.query('RELEASE SAVEPOINT m');
      this.known.set(p.id, result);
      return { id: p.id, ...result };
    } catch (error) {
      const expected = error instanceof AppError || isDeterministicDbError(error);
      if (!expected) throw error;
      await this.em.query('ROLLBACK TO SAVEPOINT m');
      this.versions.restore(saved);
      let result: StoredResult;
      if (error instanceof AppError) {
        result = rejection(error);
      } else {
        logger.warn({ err: error, mutationId: p.id }, 'mutation rejected by the database');
        result = { status: 'rejected', version: 0, reason: `the change does not fit the stored data (${error.code})` };
      }
      // a rejection is final too: record it so a replay gets the same answer
      await this.replays.claimWithResults([{ id: p.id, result }]);
      await this.em.query('RELEASE SAVEPOINT m');
      this.known.set(p.id, result);
      return { id: p.id, ...result };
    }
  }

  /**
   * A run of patches of one kind in one savepoint. Should another push claim one of its mutation ids
   * meanwhile (possible only for an id reused in another building, since pushes to one building
   * queue on its lock), the batch is rolled back and planned again, which then answers that one
   * as a duplicate; a database error replays the run one mutation per savepoint.
   */
  private async batch(run: Prepared[]): Promise<void> {
    for (let attempt = 0; attempt < 2; attempt++) {
      const saved = this.versions.entries();
      await this.em.query('SAVEPOINT batch');
      try {
        const results = await this.batchInSavepoint(run, attempt > 0);
        if (results) {
          await this.em.query('RELEASE SAVEPOINT batch');
          this.results.push(...results);
          return;
        }
      } catch (error) {
        if (error instanceof AppError) throw error;
        logger.warn({ err: error, mutations: run.length }, 'patch batch failed: replaying one by one');
        attempt = 2;
      }
      await this.em.query('ROLLBACK TO SAVEPOINT batch');
      await this.em.query('RELEASE SAVEPOINT batch');
      this.versions.restore(saved);
    }
    for (const p of run) this.results.push(await this.single(p));
  }

  /**
   * Read the records of the run's ids, plan every patch in memory, claim the new ids with their
   * results, then write the rows. The reads before the claim are safe: every writer of these rows
   * holds the building locks this push took first. Null when a claim was lost to another push.
   */
  private async batchInSavepoint(run: Prepared[], reread: boolean): Promise<MutationResult[] | null> {
    const firstIndex = new Map<string, number>();
    run.forEach((p, i) => {
      if (!firstIndex.has(p.id)) firstIndex.set(p.id, i);
    });
    const ids = [...firstIndex.keys()];
    const stored = reread
      ? await this.replays.stored(ids)
      : new Map(ids.filter((id) => this.known.has(id)).map((id) => [id, this.known.get(id)!]));

    const answers: (StoredResult | null)[] = run.map(() => null);
    const work: { index: number; mutation: Mutation; item: PatchItem<Checked['fields']> }[] = [];
    const checked: Checked[] = [];
    run.forEach((p, index) => {
      if (firstIndex.get(p.id) !== index || stored.has(p.id)) return;
      if (!p.ok) {
        answers[index] = { status: 'rejected', version: 0, reason: p.reason, ...(p.fields && { fields: p.fields }) };
        return;
      }
      const w = this.context(p.mutation);
      work.push({ index, mutation: p.mutation, item: { w, id: p.mutation.entityId, patch: p.fields } });
      checked.push(p);
    });
    const plan = await planRun(checked, work.map((x) => x.item));
    plan.outcomes.forEach((outcome, k) => {
      const { index, mutation, item } = work[k];
      answers[index] = outcome.ok ? this.finish(mutation, item.w) : rejection(outcome.error);
    });
    const fresh = run.flatMap((p, index) => {
      const result = answers[index];
      return result ? [{ id: p.id, index, result }] : [];
    });
    if (plan.claims && plan.claims.claimed < work.length) return null;
    const { toClaim, toRecord, final } = byClaim(fresh, work.map((x) => x.index), plan.claims);
    checkFinal(final);
    const claimed = await this.replays.claimWithResults(toClaim);
    if (claimed.size < toClaim.length) return null;
    await this.replays.record(toRecord);
    await plan.persist();
    for (const { id, result } of fresh) this.known.set(id, result);
    return run.map((p, index) => {
      const own = answers[index];
      if (own) return { id: p.id, ...own };
      const first = answers[firstIndex.get(p.id)!];
      return Push.duplicate(p.id, first ?? stored.get(p.id)!);
    });
  }
}

/** The name a mutation stands under in a run, malformed ones included. */
function nameOf(p: Prepared): unknown {
  return p.name;
}

/** Route one checked mutation to its kind's handler (kinds/index.ts): no switch by kind. */
function apply<N extends MutationName>(w: WriteContext, checked: Checked<N>): Promise<unknown> {
  return MUTATION_HANDLERS[checked.name](w, checked.mutation, checked.fields);
}

/** Plan a run of patches with its kind's planner (every item of a run has the same name). */
async function planRun<N extends MutationName>(
  checked: readonly Checked<N>[],
  items: readonly PatchItem<Checked<N>['fields']>[],
): Promise<PatchPlan> {
  if (checked.length === 0) return { outcomes: [], persist: async () => {} };
  const planner = PATCH_PLANNERS[checked[0].name];
  if (!planner) throw new Error(`no planner for ${checked[0].name}`);
  return planner(items);
}

/**
 * Apply a push inside the caller's transaction (tests hold one open to prove the cursor rule).
 * The envelope must already be checked (pushEnvelope); every mutation gets a result.
 */
export async function applyPush(em: EntityManager, actor: Actor, input: PushInput): Promise<PushResponse> {
  requireSchemaVersion(input.schemaVersion);
  const prepared = input.mutations.map((raw): Prepared => {
    const p = prepare(raw, input.deviceId);
    // keep the name of a malformed mutation so it still falls in the batch where it stood
    return p.ok ? p : { ...p, name: raw.name };
  });
  const push = new Push(em, actor, input.deviceId);
  await push.lockBuildings(prepared);
  await push.run(prepared);
  return { serverHlc: serverStamp(), results: push.results };
}

/** `POST /api/sync/push`: one transaction for the whole batch. */
export function push(ds: DataSource, actor: Actor, input: PushInput): Promise<PushResponse> {
  requireSchemaVersion(input.schemaVersion);
  return ds.transaction((em) => applyPush(em, actor, input));
}

// ---------- pull ----------

/** `POST /api/sync/pull`: pages of changes per building, cut by row (pull.ts). */
export async function pull(ds: DataSource, actor: Actor, body: PullBody): Promise<PullResponse> {
  requireSchemaVersion(body.schemaVersion);
  return pullPages(ds, actor, body);
}
