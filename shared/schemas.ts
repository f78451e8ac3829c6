/**
 * The API contract: every request and response body as a zod schema. The server parses input
 * with these; the client takes its types from them (z.infer).
 */
import { z } from 'zod';
import {
  BREAKER_TYPES,
  DEMAND_BASES,
  DEMAND_UNITS,
  FAULT_SOURCES,
  CIRCUIT_STATUSES,
  CONDUCTOR_SIZES,
  EQUIPMENT_CONDITIONS,
  INSULATION_TEMPS_C,
  LOAD_KINDS,
  MATERIALS,
  PANEL_KINDS,
  ROLES,
  SYSTEMS,
} from './domain';
import { isoDate, longText, requiredText, text } from './text';

const amps = z
  .number({ error: 'must be a number of amperes' })
  .int('whole amperes')
  .positive('must be more than 0')
  .max(6000, 'at most 6000 A');
const kiloAmps = z
  .number({ error: 'must be a number of kA' })
  .positive('must be more than 0')
  .max(200, 'at most 200 kA');
/** a clamp-meter reading, A */
const measuredAmps = z
  .number({ error: 'must be a number of amperes' })
  .min(0, 'cannot be negative')
  .max(10000, 'at most 10000 A');
const literalUnion = <T extends readonly (string | number)[]>(values: T, what: string) =>
  z.literal(values, { error: `${what}: one of ${values.join(', ')}` });

export const idSchema = z.uuid('must be a UUID');

/** Columns every synced row carries (SYNC.md). */
export const syncColumns = {
  id: idSchema,
  /** hybrid logical clock stamp of the last write */
  updatedAt: z.string(),
  updatedBy: z.string().nullable(),
  /** tombstone: set when deleted, never hard-deleted */
  deletedAt: z.string().nullable(),
  /** server version from the building's counter, used by pull cursors */
  version: z.number(),
};

// ---------- auth ----------

export const signInBody = z.object({
  email: z.email('enter an e-mail address').max(200),
  password: z.string().min(1, 'enter your password').max(200),
});
export type SignInBody = z.infer<typeof signInBody>;

export const userSchema = z.object({ id: z.string(), email: z.string(), name: z.string() });
export type User = z.infer<typeof userSchema>;

export const membershipSchema = z.object({
  organisationId: z.string(),
  organisationName: z.string(),
  role: z.enum(ROLES),
  /** the organisation's settings (due days by priority, photo location policy) */
  settings: z.object({
    dueDays: z.object({ 1: z.number(), 2: z.number(), 3: z.number(), 4: z.number() }),
    keepPhotoLocation: z.boolean(),
  }),
  /** everyone in the organisation, for assigning work */
  people: z.array(z.object({ id: z.string(), name: z.string(), role: z.enum(ROLES) })),
});
export type Membership = z.infer<typeof membershipSchema>;

export const meResponse = z.object({ user: userSchema, memberships: z.array(membershipSchema) });
export type MeResponse = z.infer<typeof meResponse>;
/** `GET /api/me`: the signed-in user, or `{ user: null }` with no session (not a 401). */
export const sessionResponse = z.union([meResponse, z.object({ user: z.null() })]);
export type SessionResponse = z.infer<typeof sessionResponse>;

// ---------- buildings ----------

export const buildingFields = z.object({
  name: requiredText(120, 'a name'),
  address: longText(300),
  notes: longText(2000),
});
export const buildingCreateBody = buildingFields.extend({
  id: idSchema.optional(),
  address: buildingFields.shape.address.default(''),
  notes: buildingFields.shape.notes.default(''),
  organisationId: idSchema.optional(),
});
export const buildingPatchBody = buildingFields.partial().strict();
export type BuildingCreateBody = z.infer<typeof buildingCreateBody>;
export type BuildingPatchBody = z.infer<typeof buildingPatchBody>;

export const buildingSchema = z.object({
  ...syncColumns,
  organisationId: z.string(),
  name: z.string(),
  address: z.string(),
  notes: z.string(),
  /** the role the signed-in user holds for this building */
  role: z.enum(ROLES),
  panelCount: z.number(),
});
export type Building = z.infer<typeof buildingSchema>;

// ---------- panels ----------

const panelFieldsBase = z.object({
  tag: requiredText(20, 'a tag'),
  location: text(200),
  kind: z.enum(PANEL_KINDS, { error: `one of ${PANEL_KINDS.join(', ')}` }),
  system: z.enum(SYSTEMS, { error: 'choose the electrical system' }),
  busRatingA: amps,
  /** null = main lugs only */
  mainRatingA: amps.nullable(),
  shortCircuitKA: kiloAmps.nullable(),
  /**
   * maximum available fault current at the line terminals, kA — recorded from the NEC 110.24 label,
   * the utility or an engineer's study, never computed (with its date and source)
   */
  availableFaultKA: kiloAmps.nullable(),
  availableFaultOn: isoDate.nullable(),
  availableFaultSource: literalUnion(FAULT_SOURCES, 'source').nullable(),
  /** the panel is marked as part of a tested series combination (NEC 240.86), and what the marking says */
  seriesRated: z.boolean({ error: 'yes or no' }),
  seriesRatingNote: text(300),
  /** the feeder's overcurrent device, A (NEC 220.87 compares against the lower of it and the panel) */
  feederRatingA: amps.nullable(),
  /** highest measured demand (NEC 220.87): its figure, unit, the period it covers and the period's end */
  peakDemand: z
    .number({ error: 'must be a number' })
    .min(0, 'cannot be negative')
    .max(100000, 'too large')
    .nullable(),
  peakDemandUnit: literalUnion(DEMAND_UNITS, 'unit').nullable(),
  peakDemandBasis: literalUnion(DEMAND_BASES, 'period').nullable(),
  peakDemandOn: isoDate.nullable(),
  /** clamp-meter readings per phase and neutral, taken together (one stamp: shared/merge.ts) */
  measuredA: measuredAmps.nullable(),
  measuredB: measuredAmps.nullable(),
  measuredC: measuredAmps.nullable(),
  measuredN: measuredAmps.nullable(),
  measuredOn: isoDate.nullable(),
  /**
   * the temperature the panel's terminations are listed and marked for; null = not known, and NEC
   * 110.14(C)(1) then takes 60 °C for circuits of 100 A or less or 14–1 AWG
   */
  terminationTempC: literalUnion(INSULATION_TEMPS_C, 'termination rating').nullable(),
  spaces: z
    .number({ error: 'must be a number' })
    .int('a whole number')
    .min(2, 'at least 2')
    .max(84, 'at most 84'),
  fedFromPanelId: idSchema.nullable(),
  fedFromPosition: z.number().int().min(1).max(84).nullable(),
  maker: text(120),
  model: text(120),
  installedOn: isoDate.nullable(),
  condition: literalUnion(EQUIPMENT_CONDITIONS, 'condition'),
});
export const panelFields = panelFieldsBase;
const panelShape = panelFieldsBase.shape;

type PanelRuleShape = Pick<
  z.infer<typeof panelFieldsBase>,
  | 'availableFaultKA' | 'availableFaultOn' | 'availableFaultSource'
  | 'peakDemand' | 'peakDemandUnit' | 'peakDemandBasis' | 'peakDemandOn'
  | 'measuredA' | 'measuredB' | 'measuredC' | 'measuredN' | 'measuredOn'
>;
/** The fields panelRuleErrors looks at: a patch touching none of them needs no check. */
export const PANEL_RULE_FIELDS: readonly string[] = [
  'availableFaultKA', 'availableFaultOn', 'availableFaultSource',
  'peakDemand', 'peakDemandUnit', 'peakDemandBasis', 'peakDemandOn',
  'measuredA', 'measuredB', 'measuredC', 'measuredN', 'measuredOn',
];

/**
 * Rules between a panel's fields: a recorded figure is only worth its context. A fault current
 * without its date and source cannot be checked against a newer label (NEC 110.24 asks for the
 * date); a measured peak needs its unit and period (220.87 allows a year, or 30 days recorded);
 * clamp readings need the day they were taken. Returns `{ field: message }`.
 */
export function panelRuleErrors(p: PanelRuleShape): Record<string, string> {
  const out: Record<string, string> = {};
  if (p.availableFaultKA !== null) {
    if (p.availableFaultOn === null) out.availableFaultOn = 'the date on the label or of the study (NEC 110.24)';
    if (p.availableFaultSource === null) out.availableFaultSource = 'say where the figure comes from: label, utility or engineer';
  }
  if (p.peakDemand !== null) {
    if (p.peakDemandUnit === null) out.peakDemandUnit = 'A or kVA';
    if (p.peakDemandBasis === null) out.peakDemandBasis = 'a year of data, or 30 days recorded';
    if (p.peakDemandOn === null) out.peakDemandOn = 'the date the period ended';
  }
  const clamped = [p.measuredA, p.measuredB, p.measuredC, p.measuredN].some((x) => x !== null);
  if (clamped && p.measuredOn === null) out.measuredOn = 'the date of the clamp readings';
  return out;
}

/** Defaults apply when a panel is created, never to a patch (a patch names what changes). */
export const panelCreateBody = panelFieldsBase.extend({
  id: idSchema.optional(),
  location: panelShape.location.default(''),
  kind: panelShape.kind.default('panelboard'),
  mainRatingA: panelShape.mainRatingA.default(null),
  shortCircuitKA: panelShape.shortCircuitKA.default(null),
  availableFaultKA: panelShape.availableFaultKA.default(null),
  availableFaultOn: panelShape.availableFaultOn.default(null),
  availableFaultSource: panelShape.availableFaultSource.default(null),
  seriesRated: panelShape.seriesRated.default(false),
  seriesRatingNote: panelShape.seriesRatingNote.default(''),
  feederRatingA: panelShape.feederRatingA.default(null),
  peakDemand: panelShape.peakDemand.default(null),
  peakDemandUnit: panelShape.peakDemandUnit.default(null),
  peakDemandBasis: panelShape.peakDemandBasis.default(null),
  peakDemandOn: panelShape.peakDemandOn.default(null),
  measuredA: panelShape.measuredA.default(null),
  measuredB: panelShape.measuredB.default(null),
  measuredC: panelShape.measuredC.default(null),
  measuredN: panelShape.measuredN.default(null),
  measuredOn: panelShape.measuredOn.default(null),
  terminationTempC: panelShape.terminationTempC.default(null),
  fedFromPanelId: panelShape.fedFromPanelId.default(null),
  fedFromPosition: panelShape.fedFromPosition.default(null),
  maker: panelShape.maker.default(''),
  model: panelShape.model.default(''),
  installedOn: panelShape.installedOn.default(null),
  condition: panelShape.condition.default(1),
}).superRefine((p, ctx) => {
  for (const [field, message] of Object.entries(panelRuleErrors(p))) ctx.addIssue({ code: 'custom', path: [field], message });
});
export const panelPatchBody = panelFieldsBase.partial().strict();
export type PanelCreateBody = z.infer<typeof panelCreateBody>;
export type PanelPatchBody = z.infer<typeof panelPatchBody>;

export const panelSchema = z.object({
  ...syncColumns,
  buildingId: z.string(),
  tag: z.string(),
  location: z.string(),
  kind: z.enum(PANEL_KINDS),
  system: z.enum(SYSTEMS),
  busRatingA: z.number(),
  mainRatingA: z.number().nullable(),
  shortCircuitKA: z.number().nullable(),
  availableFaultKA: z.number().nullable(),
  availableFaultOn: z.string().nullable(),
  availableFaultSource: z.enum(FAULT_SOURCES).nullable(),
  seriesRated: z.boolean(),
  seriesRatingNote: z.string(),
  feederRatingA: z.number().nullable(),
  peakDemand: z.number().nullable(),
  peakDemandUnit: z.enum(DEMAND_UNITS).nullable(),
  peakDemandBasis: z.enum(DEMAND_BASES).nullable(),
  peakDemandOn: z.string().nullable(),
  measuredA: z.number().nullable(),
  measuredB: z.number().nullable(),
  measuredC: z.number().nullable(),
  measuredN: z.number().nullable(),
  measuredOn: z.string().nullable(),
  terminationTempC: z.union([z.literal(60), z.literal(75), z.literal(90)]).nullable(),
  spaces: z.number(),
  fedFromPanelId: z.string().nullable(),
  fedFromPosition: z.number().nullable(),
  maker: z.string(),
  model: z.string(),
  installedOn: z.string().nullable(),
  condition: z.union([z.literal(1), z.literal(2), z.literal(3)]),
});
export type Panel = z.infer<typeof panelSchema>;

// ---------- circuits ----------

const circuitFieldsBase = z.object({
  position: z
    .number({ error: 'must be a position number' })
    .int('a whole position number')
    .min(1, 'positions start at 1')
    .max(84, 'at most 84'),
  poles: literalUnion([1, 2, 3] as const, 'poles'),
  /** trip rating; null for a space (no breaker) */
  ratingA: amps.nullable(),
  breakerType: z.enum(BREAKER_TYPES, { error: 'choose a breaker type' }),
  /** circuit directory text (NEC 408.4(A)) */
  description: text(200),
  loadKind: z.enum(LOAD_KINDS, { error: 'choose a load kind' }),
  loadVA: z
    .number({ error: 'must be a number of VA' })
    .min(0, 'cannot be negative')
    .max(2_000_000, 'too large')
    .nullable()
    ,
  continuous: z.boolean(),
  conductorSize: z.enum(CONDUCTOR_SIZES, { error: 'choose a conductor size' }).nullable(),
  conductorMaterial: z.enum(MATERIALS, { error: 'Cu or Al' }).nullable(),
  insulationTempC: literalUnion(INSULATION_TEMPS_C, 'insulation rating').nullable(),
  /** this breaker's termination rating when it differs from the panel's; null = the panel's */
  terminationTempC: literalUnion(INSULATION_TEMPS_C, 'termination rating').nullable(),
  /** one-way length */
  lengthFt: z
    .number({ error: 'must be a length in feet' })
    .positive('must be more than 0')
    .max(5000, 'at most 5000 ft')
    .nullable()
    ,
  status: z.enum(CIRCUIT_STATUSES, { error: 'in-use, spare or space' }),
  feedsPanelId: idSchema.nullable(),
  handleLock: z.boolean(),
  notes: longText(2000),
  /** the time-current band of the organisation's library its trip tests are judged against */
  bandId: idSchema.nullable(),
  /** the breaker's interrupting rating, kA (NEC 110.9), as marked on it */
  interruptingKA: kiloAmps.nullable(),
  /** the breaker's maker and catalogue number, as marked on it */
  breakerMake: text(120),
  catalogueNumber: text(120),
  /** ambient temperature where the conductors run, °C (NEC Table 310.15(B)(1)); null = 30 °C */
  ambientC: z
    .number({ error: 'must be a number of °C' })
    .min(-40, 'at least −40 °C')
    .max(80, 'at most 80 °C')
    .nullable(),
  /** current-carrying conductors in the raceway or cable (NEC Table 310.15(C)(1)); null = 3 or fewer */
  currentCarrying: z
    .number({ error: 'must be a number' })
    .int('a whole number')
    .min(1, 'at least 1')
    .max(100, 'at most 100')
    .nullable(),
  /** traced at the panel: when and by whom (a person of the organisation); both null = not verified */
  verifiedOn: isoDate.nullable(),
  verifiedBy: idSchema.nullable(),
});

/** "Verified at the panel" is a date and a person together, or neither. */
export function verificationErrors(c: { verifiedOn: string | null; verifiedBy: string | null }): Record<string, string> {
  if (c.verifiedOn !== null && c.verifiedBy === null) return { verifiedBy: 'say who verified it at the panel' };
  if (c.verifiedOn === null && c.verifiedBy !== null) return { verifiedOn: 'the date it was verified at the panel' };
  return {};
}

/**
 * Rules between a circuit's fields that no single field's schema can state; applied to a created
 * circuit and to a stored circuit with a patch merged in. Returns `{ field: message }`.
 */
export function circuitRuleErrors(c: {
  status: string;
  ratingA: number | null;
}): Record<string, string> {
  const fields: Record<string, string> = {};
  if (c.status !== 'space' && c.ratingA === null) fields.ratingA = 'a breaker needs its trip rating';
  if (c.status === 'space' && c.ratingA !== null) fields.ratingA = 'a space has no breaker: clear the rating';
  return fields;
}

function circuitCrossChecks(c: { status: string; ratingA: number | null }, ctx: z.RefinementCtx) {
  for (const [field, message] of Object.entries(circuitRuleErrors(c))) {
    ctx.addIssue({ code: 'custom', path: [field], message });
  }
}

function circuitVerificationChecks(c: { verifiedOn: string | null; verifiedBy: string | null }, ctx: z.RefinementCtx) {
  for (const [field, message] of Object.entries(verificationErrors(c))) {
    ctx.addIssue({ code: 'custom', path: [field], message });
  }
}

export const circuitFields = circuitFieldsBase;
const circuitShape = circuitFieldsBase.shape;
/** Defaults apply when a circuit is created, never to a patch. */
export const circuitCreateBody = circuitFieldsBase
  .extend({
    id: idSchema.optional(),
    poles: circuitShape.poles.default(1),
    ratingA: circuitShape.ratingA.default(null),
    breakerType: circuitShape.breakerType.default('standard'),
    description: circuitShape.description.default(''),
    loadKind: circuitShape.loadKind.default('other'),
    loadVA: circuitShape.loadVA.default(null),
    continuous: circuitShape.continuous.default(false),
    conductorSize: circuitShape.conductorSize.default(null),
    conductorMaterial: circuitShape.conductorMaterial.default(null),
    insulationTempC: circuitShape.insulationTempC.default(null),
    terminationTempC: circuitShape.terminationTempC.default(null),
    lengthFt: circuitShape.lengthFt.default(null),
    status: circuitShape.status.default('in-use'),
    feedsPanelId: circuitShape.feedsPanelId.default(null),
    handleLock: circuitShape.handleLock.default(false),
    notes: circuitShape.notes.default(''),
    bandId: circuitShape.bandId.default(null),
    interruptingKA: circuitShape.interruptingKA.default(null),
    breakerMake: circuitShape.breakerMake.default(''),
    catalogueNumber: circuitShape.catalogueNumber.default(''),
    ambientC: circuitShape.ambientC.default(null),
    currentCarrying: circuitShape.currentCarrying.default(null),
    verifiedOn: circuitShape.verifiedOn.default(null),
    verifiedBy: circuitShape.verifiedBy.default(null),
  })
  .superRefine(circuitCrossChecks)
  .superRefine(circuitVerificationChecks);
export const circuitPatchBody = circuitFieldsBase.partial().strict();
export type CircuitCreateBody = z.infer<typeof circuitCreateBody>;
export type CircuitPatchBody = z.infer<typeof circuitPatchBody>;
export type CircuitFields = z.infer<typeof circuitFieldsBase>;

export const circuitSchema = z.object({
  ...syncColumns,
  panelId: z.string(),
  position: z.number(),
  poles: z.union([z.literal(1), z.literal(2), z.literal(3)]),
  ratingA: z.number().nullable(),
  breakerType: z.enum(BREAKER_TYPES),
  description: z.string(),
  loadKind: z.enum(LOAD_KINDS),
  loadVA: z.number().nullable(),
  continuous: z.boolean(),
  conductorSize: z.enum(CONDUCTOR_SIZES).nullable(),
  conductorMaterial: z.enum(MATERIALS).nullable(),
  insulationTempC: z.union([z.literal(60), z.literal(75), z.literal(90)]).nullable(),
  terminationTempC: z.union([z.literal(60), z.literal(75), z.literal(90)]).nullable(),
  lengthFt: z.number().nullable(),
  status: z.enum(CIRCUIT_STATUSES),
  feedsPanelId: z.string().nullable(),
  handleLock: z.boolean(),
  notes: z.string(),
  bandId: z.string().nullable(),
  interruptingKA: z.number().nullable(),
  breakerMake: z.string(),
  catalogueNumber: z.string(),
  ambientC: z.number().nullable(),
  currentCarrying: z.number().nullable(),
  verifiedOn: z.string().nullable(),
  verifiedBy: z.string().nullable(),
});
export type Circuit = z.infer<typeof circuitSchema>;

// ---------- responses ----------

export const buildingsResponse = z.object({ buildings: z.array(buildingSchema) });
export const buildingResponse = z.object({ building: buildingSchema, panels: z.array(panelSchema) });
export const panelResponse = z.object({
  panel: panelSchema,
  building: buildingSchema,
  circuits: z.array(circuitSchema),
});
export type BuildingsResponse = z.infer<typeof buildingsResponse>;
export type BuildingResponse = z.infer<typeof buildingResponse>;
export type PanelResponse = z.infer<typeof panelResponse>;

export const idParams = z.object({ id: idSchema });

/** `{ error: { code, message, fields? } }` — the one error shape of the API. */
export const apiErrorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorBody>;

/** Turn zod issues into `{ field: message }`, first message per field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}
