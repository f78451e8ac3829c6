import type { MutationName } from '../../../shared/sync';
import { arcFlashMutations, arcFlashPlanners } from './arc-flash';
import { bandSpec } from './band';
import { buildingMutations } from './building';
import { circuitMutations, circuitPlanners } from './circuit';
import { commentMutations } from './comment';
import { conflictMutations } from './conflict';
import { deficiencyMutations, deficiencyPlanners, deficiencySpec } from './deficiency';
import { inspectionMutations, inspectionPlanners, inspectionSpec } from './inspection';
import { panelMutations } from './panel';
import { photoMutations, photoPlanners, photoSpec } from './photo';
import { readingMutations, readingPlanners, readingSpec } from './reading';
import { tripMutations, tripPlanners, tripSpec } from './trip';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * The kind table: every mutation name of the contract (shared/sync.ts) to its kind's handler.
 * The push dispatches through it; a kind adds its names here and nowhere else on the server.
 * TypeScript checks that every name has exactly the handler its fields need.
 */
export const MUTATION_HANDLERS: MutationHandlers = {
  ...buildingMutations,
  ...panelMutations,
  ...circuitMutations,
  ...conflictMutations,
  ...inspectionMutations,
  ...readingMutations,
  ...deficiencyMutations,
  ...commentMutations,
  ...tripMutations,
  ...photoMutations,
  ...arcFlashMutations,
};

/** Mutation names whose runs (consecutive, same name) are planned and written as one batch. */
export const PATCH_PLANNERS: PatchPlanners = {
  ...circuitPlanners,
  ...inspectionPlanners,
  ...readingPlanners,
  ...deficiencyPlanners,
  ...tripPlanners,
  ...photoPlanners,
  ...arcFlashPlanners,
};

export function plansRuns(name: unknown): name is MutationName {
  return typeof name === 'string' && Object.hasOwn(PATCH_PLANNERS, name);
}

/** The condition-record kinds' specs, and the band library's, for tools and documents. */
export const RECORD_SPECS = [inspectionSpec, readingSpec, deficiencySpec, tripSpec, photoSpec] as const;
export { bandSpec };
