import type { Mutation, MutationFields, MutationName } from '../../../shared/sync';
import type { AppError } from '../../http/errors';
import type { WriteContext } from '../context';

/**
 * What a kind gives the kernel: one handler per mutation name (fields typed from the contract's
 * schema for that name), and for patches a planner that takes a whole run of them at once.
 */
export type MutationHandler<N extends MutationName> = (
  w: WriteContext,
  m: Mutation,
  fields: MutationFields<N>,
) => Promise<unknown>;
export type MutationHandlers = { [N in MutationName]: MutationHandler<N> };

/** One patch of a run; every item of a run shares the em, actor and VersionBook. */
export interface PatchItem<F> {
  w: WriteContext;
  id: string;
  patch: F;
}

export type ItemOutcome<T> = { ok: true; row: T; version: number } | { ok: false; error: AppError };

/** A planned run: every outcome is known (conflict ids included) before `persist` writes it. */
export interface PatchPlan<T = unknown> {
  outcomes: ItemOutcome<T>[];
  /**
   * Set when the plan already claimed its items' mutation ids (`w.sync.mutationId`) in
   * processed_mutation, in the statement that merged them: how many it claimed (fewer than the items
   * when another push got one first), and per item whether the answer it stored is final (`applied`
   * at the push's version of the building) or left empty for the kernel to record.
   */
  claims?: { claimed: number; final: boolean[] };
  persist(): Promise<void>;
}

export type PatchPlanner<N extends MutationName> = (items: readonly PatchItem<MutationFields<N>>[]) => Promise<PatchPlan>;
/** Mutation names whose runs are planned as one batch. */
export type PatchPlanners = { [N in MutationName]?: PatchPlanner<N> };
