/**
 * The offline sync contract (SYNC.md): push and pull bodies and responses as zod schemas. The
 * server parses with them; the client's outbox and pull loop take their types from them.
 */
import { z } from 'zod';
import { arcFlashCreateBody, arcFlashLabelSchema, arcFlashPatchBody } from './arc-flash';
import { isHlc } from './hlc';
import {
  buildingCreateBody,
  buildingPatchBody,
  buildingSchema,
  circuitCreateBody,
  circuitPatchBody,
  circuitSchema,
  idSchema,
  panelCreateBody,
  panelPatchBody,
  panelSchema,
  syncColumns,
} from './schemas';
import {
  commentCreateBody,
  deficiencyCreateBody,
  deficiencyEntrySchema,
  deficiencyPatchBody,
  deficiencySchema,
  inspectionCreateBody,
  inspectionPatchBody,
  inspectionSchema,
  photoCreateBody,
  photoPatchBody,
  photoSchema,
  readingCreateBody,
  readingPatchBody,
  readingSchema,
  tripCreateBody,
  tripEventSchema,
  tripPatchBody,
} from './records';

/**
 * Version of the sync wire format and of the persisted client cache built from it. A client on
 * another version gets 409 `schema_version` and must update before it syncs again (its queued
 * mutations stay on the device).
 */
export const SCHEMA_VERSION = 1;

/** Most mutations one push may carry; more is 413 (the client splits its queue). */
export const MAX_PUSH_MUTATIONS = 500;

/**
 * Most rows one pull response carries to a device that sends `resume` (versions are then cut
 * between pages wherever the page is full).
 */
export const PULL_PAGE_ROWS = 2000;

/** The same for an older device (no `resume`): whole versions only, one version sent whole however large. */
export const PULL_PAGE_ROWS_WHOLE_VERSIONS = 5000;

/**
 * Most bytes of row JSON one pull response carries (one row more when a single row is larger), so
 * a page stays under about 1 MB on a phone: a 400-panel building arrives in parts, not in one go.
 */
export const PULL_PAGE_BYTES = 768 * 1024;

export const MUTATION_NAMES = [
  'building.create',
  'building.patch',
  'building.delete',
  'building.restore',
  'panel.create',
  'panel.patch',
  'panel.delete',
  'panel.restore',
  'circuit.create',
  'circuit.patch',
  'circuit.delete',
  'circuit.restore',
  'conflict.resolve',
  'inspection.create',
  'inspection.patch',
  'inspection.delete',
  'inspection.sign',
  'reading.create',
  'reading.patch',
  'reading.delete',
  'deficiency.create',
  'deficiency.patch',
  'deficiency.delete',
  'comment.create',
  'trip.create',
  'trip.patch',
  'trip.delete',
  'photo.create',
  'photo.patch',
  'photo.delete',
  'arc-flash.create',
  'arc-flash.patch',
  'arc-flash.delete',
] as const;
export type MutationName = (typeof MUTATION_NAMES)[number];

export const hlcSchema = z.string().refine(isHlc, 'an HLC stamp (ISO millis-4 hex counter-device id)');

/** The install's id; it is the last part of its HLC stamps. 'server' and 'seed' are taken. */
export const deviceIdSchema = z
  .string()
  .regex(/^[A-Za-z0-9_.:-]{1,64}$/, 'a device id of 1–64 letters, digits or _ . : -')
  .refine((d) => d !== 'server' && d !== 'seed', 'this device id is reserved');

const noFields = z.object({}).strict();

export const RESOLUTIONS = ['kept_theirs', 'restored_mine'] as const;
export type Resolution = (typeof RESOLUTIONS)[number];

/**
 * The `fields` of each mutation. Creates take the REST create bodies (with their defaults) minus
 * the id, which is the mutation's `entityId`; patches name only what changes. "Restore mine" is
 * an ordinary patch with the conflict's `loserValue` as fields, followed by a `conflict.resolve`
 * with `restored_mine` (after a `*.restore` when the conflict is `edited_after_delete`).
 */
export const MUTATION_FIELDS = {
  'building.create': buildingCreateBody,
  'building.patch': buildingPatchBody,
  'building.delete': noFields,
  'building.restore': noFields,
  'panel.create': panelCreateBody,
  'panel.patch': panelPatchBody,
  'panel.delete': noFields,
  'panel.restore': noFields,
  'circuit.create': circuitCreateBody,
  'circuit.patch': circuitPatchBody,
  'circuit.delete': noFields,
  'circuit.restore': noFields,
  'conflict.resolve': z.object({ resolution: z.enum(RESOLUTIONS, { error: 'kept_theirs or restored_mine' }) }).strict(),
  'inspection.create': inspectionCreateBody,
  'inspection.patch': inspectionPatchBody,
  'inspection.delete': noFields,
  'inspection.sign': noFields,
  'reading.create': readingCreateBody,
  'reading.patch': readingPatchBody,
  'reading.delete': noFields,
  'deficiency.create': deficiencyCreateBody,
  'deficiency.patch': deficiencyPatchBody,
  'deficiency.delete': noFields,
  'comment.create': commentCreateBody,
  'trip.create': tripCreateBody,
  'trip.patch': tripPatchBody,
  'trip.delete': noFields,
  'photo.create': photoCreateBody,
  'photo.patch': photoPatchBody,
  'photo.delete': noFields,
  'arc-flash.create': arcFlashCreateBody,
  'arc-flash.patch': arcFlashPatchBody,
  'arc-flash.delete': noFields,
} as const satisfies Record<MutationName, z.ZodType>;

/** The checked fields of one mutation, inferred from its schema (defaults filled in). */
export type MutationFields<N extends MutationName> = z.output<(typeof MUTATION_FIELDS)[N]>;
/** The fields a caller sends for one mutation (defaults may be left out). */
export type MutationInput<N extends MutationName> = z.input<(typeof MUTATION_FIELDS)[N]>;

// the same table seen per name, so indexing it with a generic name keeps the name's type
const FIELD_SCHEMAS: { [N in MutationName]: z.ZodType<MutationFields<N>> } = MUTATION_FIELDS;

/** Check the fields of one mutation by its name; the result is typed for that name. */
export function parseMutationFields<N extends MutationName>(
  name: N,
  input: unknown,
): z.ZodSafeParseResult<MutationFields<N>> {
  return FIELD_SCHEMAS[name].safeParse(input);
}


/** One queued change, made on the device. */
export const mutationSchema = z.object({
  /** UUIDv7 made on the device; the idempotency key of this change */
  id: idSchema,
  name: z.enum(MUTATION_NAMES, { error: `one of ${MUTATION_NAMES.join(', ')}` }),
  /** building the entity belongs to (for building.* the building itself) */
  buildingId: idSchema,
  /** the building, panel, circuit or conflict changed; client-made for creates */
  entityId: idSchema,
  /**
   * Version the device's copy was at when the change was made: the row's `version`, or the
   * building's cursor (which is at least that and lets a delete see concurrent edits of the rows
   * it cascades to). 0 for a create.
   */
  baseVersion: z.number().int().min(0),
  /** HLC stamp of the change, made by the device's clock with send() */
  hlc: hlcSchema,
  /** the changed fields; see MUTATION_FIELDS */
  fields: z.record(z.string(), z.unknown()).default({}),
  /** panel.create: the building id; circuit.create: the panel id (required there) */
  parentId: idSchema.optional(),
});
export type Mutation = z.infer<typeof mutationSchema>;

/** `POST /api/sync/push` as the client sends it. */
export const pushBody = z.object({
  deviceId: deviceIdSchema,
  schemaVersion: z.number().int(),
  mutations: z.array(mutationSchema).max(MAX_PUSH_MUTATIONS),
});
export type PushBody = z.infer<typeof pushBody>;

/**
 * What the server checks for the push as a whole. Each mutation is then checked on its own with
 * mutationSchema and MUTATION_FIELDS, so one malformed change is `rejected` instead of failing the
 * batch; only a mutation without a usable id fails the request (its result could not be matched).
 */
export const pushEnvelope = z.object({
  deviceId: deviceIdSchema,
  schemaVersion: z.number().int(),
  mutations: z.array(z.looseObject({ id: idSchema })),
});

export const MUTATION_STATUSES = ['applied', 'duplicate', 'conflict', 'rejected'] as const;
export type MutationStatus = (typeof MUTATION_STATUSES)[number];

export const mutationResultSchema = z.object({
  id: z.string(),
  /**
   * applied: stored; conflict: stored, and one or more conflict_log rows were written (some of
   * its fields may have lost, or it was an edit of a deleted row and was kept only in the log);
   * duplicate: this mutation id was processed before, the fields below are that first answer;
   * rejected: not stored (permission, validation, unknown row), `reason` says why. All four are
   * final: the client drops the mutation from its queue and shows conflict/rejected for review.
   */
  status: z.enum(MUTATION_STATUSES),
  /** building version carrying the change (pull up to it to see it); 0 when rejected */
  version: z.number(),
  conflictIds: z.array(z.string()).optional(),
  reason: z.string().optional(),
  /** for a rejection of bad input: the field → what is wrong with it */
  fields: z.record(z.string(), z.string()).optional(),
  /** for a duplicate: the status of the first answer */
  originalStatus: z.enum(['applied', 'conflict', 'rejected']).optional(),
});
export type MutationResult = z.infer<typeof mutationResultSchema>;

export const pushResponse = z.object({
  /** the server's HLC after this push: the client's clock recv()s it */
  serverHlc: z.string(),
  /** one per mutation, in the order sent */
  results: z.array(mutationResultSchema),
});
export type PushResponse = z.infer<typeof pushResponse>;

// ---------- pull ----------

/** `POST /api/sync/pull`: the device's cursor per building (absent or 0: send a full snapshot). */
export const pullBody = z.object({
  deviceId: deviceIdSchema,
  schemaVersion: z.number().int(),
  cursors: z.record(idSchema, z.number().int().min(0)).default({}),
  /**
   * Per building, the `resume` of the last page applied while it said `hasMore`. Sending the field
   * at all (even `{}`) says the device can take a version cut between pages.
   */
  resume: z.record(idSchema, z.string().max(100)).optional(),
});
export type PullBody = z.infer<typeof pullBody>;

export const CONFLICT_ENTITIES = ['building', 'panel', 'circuit', 'inspection', 'reading', 'deficiency', 'trip', 'photo', 'arc-flash'] as const;
export type ConflictEntity = (typeof CONFLICT_ENTITIES)[number];

/**
 * The condition-record tables a pull carries besides panels and circuits, by the name of their
 * list in a page (upserts and tombstones use the same names).
 */
export const RECORD_LISTS = ['inspections', 'readings', 'deficiencies', 'entries', 'trips', 'photos', 'arcFlashLabels'] as const;
export type RecordList = (typeof RECORD_LISTS)[number];
export const CONFLICT_KINDS = ['concurrent', 'edited_after_delete'] as const;

/** A losing write kept for review ("needs review"); synced down like any row, never deleted. */
export const conflictSchema = z.object({
  ...syncColumns,
  buildingId: z.string(),
  entity: z.enum(CONFLICT_ENTITIES),
  entityId: z.string(),
  /**
   * What was decided: a field name, a group joined with '+' ('position+poles'), or for
   * edited_after_delete the edited fields joined with ','.
   */
  field: z.string(),
  /** `{ field: value }` of the unit that won; for edited_after_delete `{ deletedAt }` */
  winnerValue: z.record(z.string(), z.unknown()),
  /** `{ field: value }` that lost: "restore mine" sends exactly this as a patch */
  loserValue: z.record(z.string(), z.unknown()),
  winnerHlc: z.string(),
  loserHlc: z.string(),
  winnerUser: z.string().nullable(),
  loserUser: z.string().nullable(),
  winnerUserName: z.string().nullable(),
  loserUserName: z.string().nullable(),
  loserDevice: z.string(),
  /** the mutation whose arrival found the conflict */
  mutationId: z.string().nullable(),
  kind: z.enum(CONFLICT_KINDS),
  /** null until someone keeps theirs or restores theirs */
  resolution: z.enum(RESOLUTIONS).nullable(),
});
export type Conflict = z.infer<typeof conflictSchema>;

/** One building's page of changes since the device's cursor. */
export const buildingPageSchema = z.object({
  buildingId: z.string(),
  /** the cursor was unknown (ahead of the server): drop the building's rows, then apply this snapshot */
  reset: z.boolean(),
  /** store as the new cursor once this page is applied */
  toVersion: z.number(),
  /** more pages follow: pull again right away with the new cursor (and `resume`) */
  hasMore: z.boolean(),
  /**
   * Where the next page starts inside version toVersion + 1: send it back in `resume` with the
   * cursor. Absent once the building is complete.
   */
  resume: z.string().optional(),
  /** rows of this building still to come after this page (for progress; absent when unknown) */
  remaining: z.number().int().min(0).optional(),
  /** the building row when it changed (a deleted building comes with deletedAt set); else null */
  building: buildingSchema.nullable(),
  upserts: z.object({
    panels: z.array(panelSchema),
    circuits: z.array(circuitSchema),
    conflicts: z.array(conflictSchema),
    inspections: z.array(inspectionSchema),
    readings: z.array(readingSchema),
    deficiencies: z.array(deficiencySchema),
    entries: z.array(deficiencyEntrySchema),
    trips: z.array(tripEventSchema),
    photos: z.array(photoSchema),
    arcFlashLabels: z.array(arcFlashLabelSchema),
  }),
  /** ids deleted since the cursor (empty in a snapshot, which holds live rows only) */
  tombstones: z.object({
    panels: z.array(z.string()),
    circuits: z.array(z.string()),
    inspections: z.array(z.string()),
    readings: z.array(z.string()),
    deficiencies: z.array(z.string()),
    entries: z.array(z.string()),
    trips: z.array(z.string()),
    photos: z.array(z.string()),
    arcFlashLabels: z.array(z.string()),
  }),
});
export type BuildingPage = z.infer<typeof buildingPageSchema>;

export const pullResponse = z.object({
  serverHlc: z.string(),
  /** buildings the device had a cursor for but may no longer see: wipe them from the device */
  revoked: z.array(z.string()),
  buildings: z.array(buildingPageSchema),
});
export type PullResponse = z.infer<typeof pullResponse>;
