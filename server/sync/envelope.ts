import { formatHlc, parseHlc } from '../../shared/hlc';
import { fieldErrors } from '../../shared/schemas';
import {
  SCHEMA_VERSION,
  mutationSchema,
  parseMutationFields,
  type Mutation,
  type MutationFields,
  type MutationName,
  type MutationResult,
} from '../../shared/sync';
import { AppError } from '../http/errors';
import { logger } from '../logger';
import { serverStamp } from '../services/clock';

/**
 * The push envelope: what the server checks of each mutation before anything touches the
 * database (the contract's schema for its name, its stamp's device, a create's id), and the
 * result a mutation is answered with. server/sync/push.ts applies what passes.
 */

/** A stamp further ahead of the server's wall clock than this is re-stamped (SYNC.md). */
export const MAX_CLOCK_SKEW_MS = 5 * 60 * 1000;

/** The push body after the envelope check (shared/sync.ts pushEnvelope). */
export interface PushInput {
  deviceId: string;
  schemaVersion: number;
  mutations: Array<{ id: string } & Record<string, unknown>>;
}

export type StoredResult = Omit<MutationResult, 'id'>;

/** A mutation whose fields passed the schema of its name, typed for that name. */
export interface Checked<N extends MutationName = MutationName> {
  name: N;
  mutation: Mutation;
  fields: MutationFields<N>;
}

/** A mutation checked against the contract, or the reason it cannot be applied. */
export type Prepared =
  | ({ id: string; ok: true } & Checked)
  | { id: string; ok: false; reason: string; fields?: Record<string, string>; name?: unknown };

export function requireSchemaVersion(version: number): void {
  if (version !== SCHEMA_VERSION) {
    throw new AppError(
      409,
      'schema_version',
      `This app speaks sync schema ${version}; the server speaks ${SCHEMA_VERSION}. Update the app to sync.`,
    );
  }
}

export function zodReason(fields: Record<string, string>): string {
  return Object.entries(fields)
    .map(([field, message]) => (field === '_' ? message : `${field}: ${message}`))
    .join('; ');
}

// creates whose body carries the new row's id (the REST create bodies)
const CREATES: ReadonlySet<MutationName> = new Set(['building.create', 'panel.create', 'circuit.create']);

/** Check one mutation and its fields; nothing here touches the database. */
export function prepare(raw: { id: string } & Record<string, unknown>, deviceId: string): Prepared {
  const parsed = mutationSchema.safeParse(raw);
  if (!parsed.success) {
    const fields = fieldErrors(parsed.error);
    return { id: raw.id, ok: false, reason: zodReason(fields), fields };
  }
  const mutation = parsed.data;
  if (parseHlc(mutation.hlc).deviceId !== deviceId) {
    const reason = 'the hlc stamp was not made by this device';
    return { id: mutation.id, ok: false, reason, fields: { hlc: 'not this device' } };
  }
  let input: Record<string, unknown> = mutation.fields;
  if (CREATES.has(mutation.name)) {
    if (input.id !== undefined && input.id !== mutation.entityId) {
      const reason = 'fields.id must be the entityId';
      return { id: mutation.id, ok: false, reason, fields: { id: 'must be the entityId' } };
    }
    // the new row's id is the mutation's entityId, made on the device
    input = { ...input, id: mutation.entityId };
  }
  const fields = parseMutationFields(mutation.name, input);
  if (!fields.success) {
    const problems = fieldErrors(fields.error);
    return { id: mutation.id, ok: false, reason: zodReason(problems), fields: problems };
  }
  return { id: mutation.id, ok: true, name: mutation.name, mutation, fields: fields.data };
}

export function rejection(error: AppError): StoredResult {
  const reason = error.fields ? zodReason(error.fields) : error.message;
  return { status: 'rejected', version: 0, reason, ...(error.fields && { fields: error.fields }) };
}

/** SQLSTATE classes 22 (data exception) and 23 (integrity constraint): the same input fails every time. */
export function isDeterministicDbError(error: unknown): error is Error & { code: string } {
  const code = (error as { code?: unknown })?.code;
  return typeof code === 'string' && (code.startsWith('22') || code.startsWith('23'));
}


/**
 * The stamp a mutation is applied with: its own, or the server's (keeping the device id, so stamps
 * stay unique per device) when the device's clock runs more than MAX_CLOCK_SKEW_MS ahead of `now`.
 */
export function stampFor(mutation: Mutation, deviceId: string, now: number): string {
  const skewMs = parseHlc(mutation.hlc).wallMs - now;
  if (skewMs <= MAX_CLOCK_SKEW_MS) return mutation.hlc;
  const server = parseHlc(serverStamp());
  const stamp = formatHlc({ ...server, deviceId });
  logger.warn(
    { deviceId, mutationId: mutation.id, skewMs, stamp: mutation.hlc, restamped: stamp },
    'device clock ahead of the server: mutation re-stamped',
  );
  return stamp;
}
