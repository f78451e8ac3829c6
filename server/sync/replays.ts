import type { EntityManager } from 'typeorm';
import type { PatchPlan } from './kinds/types';
import type { StoredResult } from './envelope';

/**
 * The replay record of one device's pushes (`processed_mutation`, keyed by user, device and
 * mutation id): a mutation's id is claimed once, with its answer, so a replay is answered from
 * the record as a duplicate. Only this account's records are read: another account's answer for
 * the same pair is not ours to read.
 */

/** The answer to a mutation another push has claimed but not yet committed. */
export const STILL_PROCESSING: StoredResult = { status: 'rejected', version: 0, reason: 'still being processed' };

export class ReplayRecord {
  constructor(
    private readonly em: EntityManager,
    private readonly deviceId: string,
    private readonly userId: string,
  ) {}

  /**
   * Claim ids with no answer yet (a single mutation's savepoint claims before it applies): a replay,
   * or a concurrent push of the same mutation, which waits here until the other commits, inserts
   * nothing and is answered from the record. Returns the ids claimed.
   */
  async claim(ids: string[]): Promise<Set<string>> {
    const rows: { mutation_id: string }[] = await this.em.query(
      `INSERT INTO processed_mutation (device_id, mutation_id, user_id)
       SELECT $1, m, $3 FROM unnest($2::uuid[]) AS m
       ON CONFLICT DO NOTHING RETURNING mutation_id`,
      [this.deviceId, ids, this.userId],
    );
    return new Set(rows.map((r) => r.mutation_id));
  }

  /**
   * Claim ids and store their answers in one statement; returns the ids claimed. Used by the batch
   * path, which knows every answer before it writes anything, and for a rejection, which is final too.
   */
  async claimWithResults(results: { id: string; result: StoredResult }[]): Promise<Set<string>> {
    if (results.length === 0) return new Set();
    const rows: { mutation_id: string }[] = await this.em.query(
      `INSERT INTO processed_mutation (device_id, mutation_id, user_id, result)
       SELECT $1, v.mutation_id, $2, v.result
         FROM jsonb_to_recordset($3::jsonb) AS v(mutation_id uuid, result jsonb)
       ON CONFLICT DO NOTHING RETURNING mutation_id`,
      [this.deviceId, this.userId, JSON.stringify(results.map((r) => ({ mutation_id: r.id, result: r.result })))],
    );
    return new Set(rows.map((r) => r.mutation_id));
  }

  /** The answers recorded for these ids (still being processed: claimed, not yet answered). */
  async stored(ids: string[]): Promise<Map<string, StoredResult>> {
    const rows: { mutation_id: string; result: StoredResult | null }[] = await this.em.query(
      `SELECT mutation_id, result FROM processed_mutation
        WHERE user_id = $3 AND device_id = $1 AND mutation_id = ANY($2::uuid[])`,
      [this.deviceId, ids, this.userId],
    );
    return new Map(rows.map((r) => [r.mutation_id, r.result ?? STILL_PROCESSING]));
  }

  /** Store the answers of ids claimed before. */
  async record(results: { id: string; result: StoredResult }[]): Promise<void> {
    if (results.length === 0) return;
    await this.em.query(
      `UPDATE processed_mutation AS p SET result = v.result
         FROM jsonb_to_recordset($2::jsonb) AS v(mutation_id uuid, result jsonb)
        WHERE p.user_id = $3 AND p.device_id = $1 AND p.mutation_id = v.mutation_id`,
      [this.deviceId, JSON.stringify(results.map((r) => ({ mutation_id: r.id, result: r.result }))), this.userId],
    );
  }
}

/**
 * Sort a run's answers by what the plan's own statement did with them (kinds/types.ts
 * PatchPlan.claims): `final` were claimed and stored there, `toRecord` were claimed with their
 * answer left for the kernel, `toClaim` the plan never saw (malformed mutations) or, without
 * plan claims, all of them. `planned[k]` is the run index of the plan's item k.
 */
export function byClaim<A extends { index: number }>(
  answers: A[],
  planned: number[],
  claims: PatchPlan['claims'],
): { toClaim: A[]; toRecord: A[]; final: A[] } {
  if (!claims) return { toClaim: answers, toRecord: [], final: [] };
  const item = new Map(planned.map((index, k) => [index, k]));
  const inPlan = (a: A) => item.has(a.index);
  const isFinal = (a: A) => claims.final[item.get(a.index)!];
  return {
    toClaim: answers.filter((a) => !inPlan(a)),
    toRecord: answers.filter((a) => inPlan(a) && !isFinal(a)),
    final: answers.filter((a) => inPlan(a) && isFinal(a)),
  };
}

/**
 * The answers a plan stored as final in its own statement are `applied` at the building's
 * version; anything else means the plan and the kernel disagree, and the batch is replayed one
 * by one (push.ts batch()).
 */
export function checkFinal(stored: { id: string; result: StoredResult }[]): void {
  for (const { id, result } of stored) {
    if (result.status !== 'applied' || result.conflictIds || result.reason) {
      throw new Error(`the plan stored mutation ${id} as applied, but its answer is ${result.status}`);
    }
  }
}
