/**
 * The condition record (DESIGN.md §3): inspections and their readings, deficiencies with their
 * history, recorded trips and photos. Every one is a synced row of a building, made on the device
 * and pushed like a circuit (SYNC.md); the fields of each are stated here once, for the push, the
 * pull and the screens. Time-current bands are the organisation's library (REST, see `bandSchema`).
 */
import { z } from 'zod';
import { CONDUCTOR_SIZES } from './domain';
import { idSchema, syncColumns } from './schemas';
import { isoDate, longText, requiredLongText, requiredText, text } from './text';

const isoDateTime = z.iso.datetime({ offset: true, error: 'a date and time' });
const num = (what: string) => z.number({ error: `must be a number${what ? ` of ${what}` : ''}` });
const enumOf = <T extends readonly [string, ...string[]]>(values: T, what: string) =>
  z.enum(values, { error: `${what}: one of ${values.join(', ')}` });

const syncColumnsObject = z.object(syncColumns);

// ---------- vocabulary ----------

export const INSPECTION_KINDS = ['thermal-survey', 'torque-audit', 'trip-test', 'visual', 'full-maintenance'] as const;
export type InspectionKind = (typeof INSPECTION_KINDS)[number];
export const INSPECTION_KIND_LABELS: Record<InspectionKind, string> = {
  'thermal-survey': 'Thermal survey',
  'torque-audit': 'Torque audit',
  'trip-test': 'Trip test',
  visual: 'Visual',
  'full-maintenance': 'Full maintenance',
};

export const READING_KINDS = ['thermal', 'torque', 'trip', 'visual'] as const;
export type ReadingKind = (typeof READING_KINDS)[number];

export const THERMAL_COMPONENTS = ['lug', 'breaker-body', 'bus', 'neutral', 'conductor', 'other'] as const;
export const THERMAL_COMPONENT_LABELS: Record<(typeof THERMAL_COMPONENTS)[number], string> = {
  lug: 'Lug',
  'breaker-body': 'Breaker body',
  bus: 'Bus',
  neutral: 'Neutral',
  conductor: 'Conductor',
  other: 'Other',
};
export const READING_PHASES = ['A', 'B', 'C', 'N'] as const;
export const TORQUE_UNITS = ['N·m', 'lbf-in', 'lbf-ft'] as const;
/**
 * UL 486A-486B screw kinds (NEC Informative Annex I): Table I.1 columns by wire size (slotted
 * heads No. 10 and larger, screws and set screws alike), Table I.2 slotted heads smaller than
 * No. 10 by slot length (narrow: slot under 1.2 mm wide; wide: 1.2 mm and over), Table I.3
 * internal-drive socket (hex socket set screws and cap screws) by socket size across flats.
 */
export const TORQUE_SCREWS = [
  'slotted-small', 'slotted-large', 'split-bolt', 'hex', 'slotted-under-10-narrow', 'slotted-under-10-wide', 'socket',
] as const;
/** Table I.2 slot lengths, mm ('<4' = less than 4 mm) */
export const SLOT_LENGTHS_MM = ['<4', '4', '4.8', '5.5', '6.4'] as const;
/** Table I.3 socket sizes across flats, inches */
export const SOCKET_SIZES_IN = ['1/8', '5/32', '3/16', '7/32', '1/4', '5/16', '3/8', '1/2', '9/16'] as const;
/** the slot length (slotted smaller than No. 10) or the socket size (socket), where the kind needs one */
export const SCREW_SIZES = [...SLOT_LENGTHS_MM, ...SOCKET_SIZES_IN] as const;
/** where a specified torque came from: the maker's instructions govern; the table is a fallback */
export const TORQUE_SOURCES = ['maker', 'fallback-table'] as const;

/**
 * The usual findings of a look at a panel [CP]: each ticked item raises a deficiency. Keys are
 * stored; the words are ours. `priority` is the starting priority of the deficiency it raises.
 */
export const VISUAL_CHECKS = {
  'open-knockouts': { label: 'Missing knockout closures or filler plates', priority: 2 },
  'double-tap': { label: 'Double-tapped terminal (two conductors under one screw not listed for it)', priority: 2 },
  'damaged-insulation': { label: 'Damaged conductor insulation', priority: 2 },
  corrosion: { label: 'Corrosion or moisture in the enclosure', priority: 2 },
  'working-space': { label: 'Working space in front of the panel blocked or used for storage', priority: 2 },
  'directory-missing': { label: 'Circuit directory missing, illegible or out of date', priority: 3 },
  'cover-screws': { label: 'Missing dead-front or cover screws', priority: 3 },
  'heat-arcing': { label: 'Evidence of heating or arcing (discolouration, melted parts, odour)', priority: 1 },
  'unlabelled-disconnect': { label: 'Panel or its disconnect not labelled', priority: 4 },
  'foreign-objects': { label: 'Debris or foreign objects inside the enclosure', priority: 3 },
} as const satisfies Record<string, { label: string; priority: 1 | 2 | 3 | 4 }>;
export type VisualCheck = keyof typeof VISUAL_CHECKS;
export const VISUAL_CHECK_KEYS = Object.keys(VISUAL_CHECKS) as [VisualCheck, ...VisualCheck[]];

export const DEFICIENCY_STATUSES = ['open', 'scheduled', 'repaired', 'verified', 'deferred'] as const;
export type DeficiencyStatus = (typeof DEFICIENCY_STATUSES)[number];
export const DEFICIENCY_SOURCES = ['reading', 'checklist', 'manual'] as const;
export const PRIORITIES = [1, 2, 3, 4] as const;
export type Priority = (typeof PRIORITIES)[number];
/** DESIGN.md §6 */
export const PRIORITY_LABELS: Record<Priority, string> = { 1: 'P1 now', 2: 'P2 soon', 3: 'P3 planned', 4: 'P4 watch' };
/**
 * The priority's mark, for screens and print alike: how many of four bars are filled (P1 all four,
 * P4 one). A count reads the same to a colour-blind reader and on a black-and-white printout.
 */
export const PRIORITY_BARS: Record<Priority, number> = { 1: 4, 2: 3, 3: 2, 4: 1 };
export const STATUS_LABELS: Record<DeficiencyStatus, string> = {
  open: 'Open',
  scheduled: 'Scheduled',
  repaired: 'Repaired',
  verified: 'Verified',
  deferred: 'Deferred',
};

export const PHOTO_PARENTS = ['reading', 'deficiency', 'circuit', 'panel'] as const;
/**
 * thermal / visible images of a reading; a finding's picture; evidence of a repair; a picture of
 * the equipment itself (a breaker's marking, a panel's labels)
 */
export const PHOTO_PURPOSES = ['thermal', 'visible', 'finding', 'repair', 'equipment'] as const;
/** The purposes a photo of each parent may have. */
export const PHOTO_PURPOSES_OF: Record<(typeof PHOTO_PARENTS)[number], readonly (typeof PHOTO_PURPOSES)[number][]> = {
  reading: ['thermal', 'visible'],
  deficiency: ['finding', 'repair'],
  circuit: ['equipment'],
  panel: ['equipment'],
};
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/heic'] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];
/** largest photo the server takes, bytes (a 2000 px JPEG is well under 1 MB) */
export const PHOTO_MAX_BYTES = 12 * 1024 * 1024;

const priority = z.literal(PRIORITIES, { error: 'priority: 1, 2, 3 or 4' });

// ---------- inspections ----------

const inspectionFieldsBase = z.object({
  kind: enumOf(INSPECTION_KINDS, 'kind'),
  /** the panels it covers: one for a panel inspection, several for a building round */
  panelIds: z.array(idSchema).min(1, 'choose at least one panel').max(200),
  performedOn: isoDate,
  ambientC: num('°C').min(-40, 'at least −40 °C').max(80, 'at most 80 °C').nullable(),
  /** load at the time, % of normal (NFPA 70B: at least 40 % for a thermal survey) */
  loadPct: num('%').min(0, 'cannot be negative').max(200, 'at most 200 %').nullable(),
  notes: longText(4000),
});
export const inspectionCreateBody = inspectionFieldsBase.extend({
  ambientC: inspectionFieldsBase.shape.ambientC.default(null),
  loadPct: inspectionFieldsBase.shape.loadPct.default(null),
  notes: inspectionFieldsBase.shape.notes.default(''),
});
export const inspectionPatchBody = inspectionFieldsBase.partial().strict();
export type InspectionCreateBody = z.infer<typeof inspectionCreateBody>;
export type InspectionPatchBody = z.infer<typeof inspectionPatchBody>;

export const inspectionSchema = z.object({
  ...syncColumns,
  buildingId: z.string(),
  kind: z.enum(INSPECTION_KINDS),
  panelIds: z.array(z.string()),
  performedOn: z.string(),
  ambientC: z.number().nullable(),
  loadPct: z.number().nullable(),
  notes: z.string(),
  inspectorId: z.string().nullable(),
  inspectorName: z.string(),
  /** set by the sign-off; a signed inspection is frozen */
  signedAt: z.string().nullable(),
  signedBy: z.string().nullable(),
  signedByName: z.string().nullable(),
});
export type Inspection = z.infer<typeof inspectionSchema>;

// ---------- readings ----------

/** Every reading field; which are required depends on the kind (readingKindProblems). */
const readingFieldsBase = z.object({
  inspectionId: idSchema,
  panelId: idSchema,
  kind: enumOf(READING_KINDS, 'kind'),
  circuitId: idSchema.nullable(),
  notes: longText(2000),
  // thermal
  component: enumOf(THERMAL_COMPONENTS, 'component').nullable(),
  phase: enumOf(READING_PHASES, 'phase').nullable(),
  temperatureC: num('°C').min(-40).max(1500).nullable(),
  referenceC: num('°C').min(-40).max(1500).nullable(),
  referenceBasis: enumOf(['similar', 'ambient'] as const, 'reference').nullable(),
  loadA: num('amperes').positive('must be more than 0').max(10000).nullable(),
  referenceLoadA: num('amperes').positive('must be more than 0').max(10000).nullable(),
  /**
   * taken during a test pulse of seconds (e.g. a trip test): not thermal steady state, so the raw
   * difference is judged and no load correction applies [CP]
   */
  duringTestPulse: z.boolean({ error: 'yes or no' }),
  /**
   * what the camera was set to and where it stood: emissivity and reflected temperature decide the
   * temperature it shows; distance and the camera say whether the spot was resolved (the image is
   * judged on temperatureC, the component's own temperature as the camera gave it)
   */
  emissivity: num('').min(0.01, 'at least 0.01').max(1, 'at most 1').nullable(),
  reflectedC: num('°C').min(-40, 'at least −40 °C').max(1500, 'at most 1500 °C').nullable(),
  distanceM: num('metres').positive('must be more than 0').max(100, 'at most 100 m').nullable(),
  camera: text(120),
  // torque
  /** 'main' for the main lugs or main breaker; else the circuit's terminal */
  fastener: text(120),
  specified: num('torque').positive('must be more than 0').max(10000).nullable(),
  unit: enumOf(TORQUE_UNITS, 'unit').nullable(),
  specSource: enumOf(TORQUE_SOURCES, 'source').nullable(),
  conductorSize: enumOf(CONDUCTOR_SIZES, 'conductor size').nullable(),
  screw: enumOf(TORQUE_SCREWS, 'screw').nullable(),
  screwSize: enumOf(SCREW_SIZES, 'slot length or socket size').nullable(),
  /** as found: did the fastener hold at the specified torque, or turn */
  asFound: enumOf(['held', 'turned'] as const, 'as found').nullable(),
  asFoundValue: num('torque').min(0).max(10000).nullable(),
  asLeft: num('torque').min(0).max(10000).nullable(),
  // trip test (primary injection)
  testCurrentA: num('amperes').positive('must be more than 0').max(200000).nullable(),
  tripped: z.boolean().nullable(),
  tripTimeS: num('seconds').min(0, 'cannot be negative').max(100000).nullable(),
  bandId: idSchema.nullable(),
  // visual
  check: enumOf(VISUAL_CHECK_KEYS, 'check').nullable(),
});
const readingShape = readingFieldsBase.shape;
export type ReadingFields = z.infer<typeof readingFieldsBase>;

const READING_REQUIRED: Record<ReadingKind, { field: keyof ReadingFields; message: string }[]> = {
  thermal: [
    { field: 'component', message: 'choose the component' },
    { field: 'temperatureC', message: 'enter the temperature' },
    { field: 'referenceC', message: 'enter the reference temperature' },
    { field: 'referenceBasis', message: 'similar component or ambient air?' },
  ],
  torque: [
    { field: 'specified', message: 'enter the specified torque' },
    { field: 'unit', message: 'choose the unit' },
    { field: 'specSource', message: 'where does the value come from?' },
    { field: 'asFound', message: 'held or turned?' },
    { field: 'asLeft', message: 'enter the torque as left' },
  ],
  trip: [
    { field: 'circuitId', message: 'choose the circuit tested' },
    { field: 'testCurrentA', message: 'enter the test current' },
    { field: 'tripped', message: 'did it trip?' },
  ],
  visual: [{ field: 'check', message: 'choose the finding' }],
};

/** Rules between a reading's fields that no single field can state; `{ field: message }`. */
export function readingRuleErrors(r: ReadingFields): Record<string, string> {
  const out: Record<string, string> = {};
  for (const { field, message } of READING_REQUIRED[r.kind]) {
    if (r[field] === null || r[field] === undefined) out[field] = message;
  }
  if (r.kind === 'trip' && r.tripped === true && r.tripTimeS === null) out.tripTimeS = 'enter the time to trip';
  if (r.kind === 'trip' && r.tripped === false && r.tripTimeS !== null) out.tripTimeS = 'it did not trip: clear the time';
  if (r.kind === 'torque' && r.asFound === 'turned' && r.asFoundValue === null) {
    out.asFoundValue = 'enter the torque at which it turned';
  }
  if (r.kind === 'torque' && (r.screw === 'slotted-under-10-narrow' || r.screw === 'slotted-under-10-wide')) {
    if (r.screwSize === null || !(SLOT_LENGTHS_MM as readonly string[]).includes(r.screwSize)) out.screwSize = 'choose the slot length';
    if (r.conductorSize !== null && !['14', '12', '10', '8'].includes(r.conductorSize)) {
      out.conductorSize = 'screws smaller than No. 10 are for 8 AWG and smaller';
    }
  }
  if (r.kind === 'torque' && r.screw === 'socket' && (r.screwSize === null || !(SOCKET_SIZES_IN as readonly string[]).includes(r.screwSize))) {
    out.screwSize = 'choose the socket size across flats';
  }
  if (r.kind === 'thermal' && (r.loadA === null) !== (r.referenceLoadA === null)) {
    out[r.loadA === null ? 'loadA' : 'referenceLoadA'] = 'give both loads to correct the rise, or neither';
  }
  return out;
}

export const readingCreateBody = readingFieldsBase
  .extend({
    circuitId: readingShape.circuitId.default(null),
    notes: readingShape.notes.default(''),
    component: readingShape.component.default(null),
    phase: readingShape.phase.default(null),
    temperatureC: readingShape.temperatureC.default(null),
    referenceC: readingShape.referenceC.default(null),
    referenceBasis: readingShape.referenceBasis.default(null),
    loadA: readingShape.loadA.default(null),
    referenceLoadA: readingShape.referenceLoadA.default(null),
    duringTestPulse: readingShape.duringTestPulse.default(false),
    emissivity: readingShape.emissivity.default(null),
    reflectedC: readingShape.reflectedC.default(null),
    distanceM: readingShape.distanceM.default(null),
    camera: readingShape.camera.default(''),
    fastener: readingShape.fastener.default(''),
    specified: readingShape.specified.default(null),
    unit: readingShape.unit.default(null),
    specSource: readingShape.specSource.default(null),
    conductorSize: readingShape.conductorSize.default(null),
    screw: readingShape.screw.default(null),
    screwSize: readingShape.screwSize.default(null),
    asFound: readingShape.asFound.default(null),
    asFoundValue: readingShape.asFoundValue.default(null),
    asLeft: readingShape.asLeft.default(null),
    testCurrentA: readingShape.testCurrentA.default(null),
    tripped: readingShape.tripped.default(null),
    tripTimeS: readingShape.tripTimeS.default(null),
    bandId: readingShape.bandId.default(null),
    check: readingShape.check.default(null),
  })
  .superRefine((r, ctx) => {
    for (const [field, message] of Object.entries(readingRuleErrors(r))) {
      ctx.addIssue({ code: 'custom', path: [field], message });
    }
  });
/** The inspection, panel and kind of a reading never change. */
export const readingPatchBody = readingFieldsBase.omit({ inspectionId: true, panelId: true, kind: true }).partial().strict();
export type ReadingCreateBody = z.infer<typeof readingCreateBody>;
export type ReadingPatchBody = z.infer<typeof readingPatchBody>;

/** A reading as stored and synced (the field validators also describe the stored values). */
export const readingSchema = syncColumnsObject.extend({ buildingId: z.string(), ...readingShape });
export type Reading = z.infer<typeof readingSchema>;
export const READING_FIELDS = Object.keys(readingShape) as (keyof ReadingFields)[];

// ---------- deficiencies ----------

const deficiencyFieldsBase = z.object({
  panelId: idSchema.nullable(),
  circuitId: idSchema.nullable(),
  inspectionId: idSchema.nullable(),
  readingId: idSchema.nullable(),
  source: enumOf(DEFICIENCY_SOURCES, 'source'),
  check: enumOf(VISUAL_CHECK_KEYS, 'check').nullable(),
  title: requiredText(160, 'a title'),
  description: longText(4000),
  priority,
  /** why the priority differs from the one the reading gave (required then) */
  priorityReason: longText(500),
  dueOn: isoDate,
  status: enumOf(DEFICIENCY_STATUSES, 'status'),
  assigneeId: idSchema.nullable(),
  /** what the repair was (evidence: this note or a repair photo) */
  repairNote: longText(2000),
  /** the owner's reason to defer and when to look again */
  deferReason: longText(1000),
  reviewOn: isoDate.nullable(),
  /** the owner accepted the repair plan */
  acceptedAt: isoDateTime.nullable(),
});
const deficiencyShape = deficiencyFieldsBase.shape;
export type DeficiencyFields = z.infer<typeof deficiencyFieldsBase>;
export const deficiencyCreateBody = deficiencyFieldsBase.extend({
  panelId: deficiencyShape.panelId.default(null),
  circuitId: deficiencyShape.circuitId.default(null),
  inspectionId: deficiencyShape.inspectionId.default(null),
  readingId: deficiencyShape.readingId.default(null),
  source: deficiencyShape.source.default('manual'),
  check: deficiencyShape.check.default(null),
  description: deficiencyShape.description.default(''),
  priorityReason: deficiencyShape.priorityReason.default(''),
  /** absent: from the priority and the organisation's due days */
  dueOn: deficiencyShape.dueOn.optional(),
  status: z.literal('open', { error: 'a new deficiency is open' }).default('open'),
  assigneeId: deficiencyShape.assigneeId.default(null),
  repairNote: deficiencyShape.repairNote.default(''),
  deferReason: deficiencyShape.deferReason.default(''),
  reviewOn: deficiencyShape.reviewOn.default(null),
  acceptedAt: deficiencyShape.acceptedAt.default(null),
});
/** Where a deficiency came from never changes. */
export const deficiencyPatchBody = deficiencyFieldsBase
  .omit({ panelId: true, inspectionId: true, readingId: true, source: true, check: true })
  .partial()
  .strict();
export type DeficiencyCreateBody = z.infer<typeof deficiencyCreateBody>;
export type DeficiencyPatchBody = z.infer<typeof deficiencyPatchBody>;
export const DEFICIENCY_FIELDS = Object.keys(deficiencyShape) as (keyof DeficiencyFields)[];

export const deficiencySchema = syncColumnsObject.extend({
  buildingId: z.string(),
  raisedBy: z.string().nullable(),
  raisedByName: z.string(),
  ...deficiencyShape,
});
export type Deficiency = z.infer<typeof deficiencySchema>;

/** One line of a deficiency's history: a change the server recorded, or a comment. */
export const commentCreateBody = z.object({
  deficiencyId: idSchema,
  text: requiredLongText(2000, 'a comment'),
});
export type CommentCreateBody = z.infer<typeof commentCreateBody>;
export const deficiencyEntrySchema = syncColumnsObject.extend({
  buildingId: z.string(),
  deficiencyId: z.string(),
  kind: z.enum(['comment', 'change']),
  text: z.string(),
  /** for a change: field → [before, after] */
  changes: z.record(z.string(), z.tuple([z.unknown(), z.unknown()])),
  userId: z.string().nullable(),
  userName: z.string(),
  /** when, ISO (the wall time of the writer's stamp) */
  at: z.string(),
});
export type DeficiencyEntry = z.infer<typeof deficiencyEntrySchema>;

// ---------- recorded trips ----------

const tripFieldsBase = z.object({
  panelId: idSchema,
  circuitId: idSchema,
  occurredAt: isoDateTime,
  /** load current at or just before the trip, if known */
  loadA: num('amperes').min(0, 'cannot be negative').max(10000).nullable(),
  /** what was happening */
  circumstances: longText(2000),
});
export const tripCreateBody = tripFieldsBase.extend({
  loadA: tripFieldsBase.shape.loadA.default(null),
  circumstances: tripFieldsBase.shape.circumstances.default(''),
});
export const tripPatchBody = tripFieldsBase.omit({ panelId: true, circuitId: true }).partial().strict();
export type TripCreateBody = z.infer<typeof tripCreateBody>;
export type TripPatchBody = z.infer<typeof tripPatchBody>;
export const tripEventSchema = syncColumnsObject.extend({ buildingId: z.string(), ...tripFieldsBase.shape });
export type TripEvent = z.infer<typeof tripEventSchema>;

// ---------- photos ----------

export const photoCreateBody = z.object({
  parentKind: enumOf(PHOTO_PARENTS, 'parent'),
  parentId: idSchema,
  purpose: enumOf(PHOTO_PURPOSES, 'purpose'),
  /** hex SHA-256 of the bytes the device will upload */
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'a hex SHA-256'),
  bytes: z.number().int().positive('an empty photo').max(PHOTO_MAX_BYTES, `at most ${PHOTO_MAX_BYTES} bytes`),
  contentType: enumOf(PHOTO_TYPES, 'type'),
  width: z.number().int().positive().max(20000).nullable().default(null),
  height: z.number().int().positive().max(20000).nullable().default(null),
  takenAt: isoDateTime,
  caption: text(300).default(''),
});
export const photoPatchBody = z.object({ caption: text(300) }).partial().strict();
export type PhotoCreateBody = z.infer<typeof photoCreateBody>;
export const photoSchema = syncColumnsObject.extend({
  buildingId: z.string(),
  ...photoCreateBody.shape,
  /** the bytes reached the server (and a thumbnail was made) */
  uploaded: z.boolean(),
});
export type Photo = z.infer<typeof photoSchema>;

// ---------- time-current bands (the organisation's library, REST) ----------

export const bandPointSchema = z
  .object({
    /** test current as a multiple of the rating */
    multiple: num('').positive('must be more than 0').max(100),
    /** log–log interpolation needs times above 0 (shared/calc/trip.ts tripBand) */
    minS: num('seconds').positive('must be more than 0 s').max(100000),
    maxS: num('seconds').positive('must be more than 0').max(100000),
  })
  .refine((p) => p.minS <= p.maxS, { path: ['maxS'], message: 'the maximum time is below the minimum' });

const bandFieldsBase = z.object({
  label: requiredText(120, 'a label'),
  ratingA: num('amperes').int('whole amperes').positive('must be more than 0').max(6000),
  /** where the points were read from: the maker's curve number and edition */
  source: longText(300),
  points: z
    .array(bandPointSchema)
    .min(2, 'at least two points of the curve')
    .max(40)
    .refine((ps) => ps.every((p, i) => i === 0 || p.multiple > ps[i - 1].multiple), {
      message: 'points must go up in multiple of rating',
    })
    .superRefine((ps, ctx) => {
      // an inverse-time band falls as current rises: a time that rises is an entry error [CP]
      ps.forEach((p, i) => {
        const before = ps[i - 1];
        if (i === 0 || !(p.multiple > before.multiple)) return;
        for (const edge of ['minS', 'maxS'] as const) {
          if (p[edge] > before[edge]) {
            ctx.addIssue({
              code: 'custom',
              path: [i, edge],
              message: `the ${edge === 'minS' ? 'minimum' : 'maximum'} time cannot rise as current rises (${before[edge]} s at ${before.multiple}×)`,
            });
          }
        }
      });
    }),
  /** instantaneous pickup as a multiple of the rating, and its tolerance ±% */
  instantaneousMultiple: num('').positive().max(100).nullable(),
  instantaneousTolerancePct: num('%').min(0).max(100).nullable(),
});
export const bandCreateBody = bandFieldsBase.extend({
  id: idSchema.optional(),
  source: bandFieldsBase.shape.source.default(''),
  instantaneousMultiple: bandFieldsBase.shape.instantaneousMultiple.default(null),
  instantaneousTolerancePct: bandFieldsBase.shape.instantaneousTolerancePct.default(null),
});
export const bandPatchBody = bandFieldsBase.partial().strict();
export type BandCreateBody = z.infer<typeof bandCreateBody>;
export type BandPatchBody = z.infer<typeof bandPatchBody>;
export const bandSchema = bandFieldsBase.extend({
  id: z.string(),
  organisationId: z.string(),
  updatedAt: z.string(),
});
export type Band = z.infer<typeof bandSchema>;
export const bandsResponse = z.object({ bands: z.array(bandSchema) });
/** The answer to adding a band. */
export const bandResponse = z.object({ band: bandSchema });

// ---------- organisation settings ----------

/**
 * Days to repair by priority, fitting the words (our defaults [CP]): P1 "now" the day it is
 * raised, P2 "soon" within a month, P3 "planned" within a quarter, P4 "watch" by the next yearly
 * survey.
 */
export const DEFAULT_DUE_DAYS: Record<Priority, number> = { 1: 0, 2: 30, 3: 90, 4: 365 };
const days = num('days').int('whole days').min(0, 'cannot be negative').max(3650, 'at most 3650 days');
/** Whole days per priority, never sooner for a lower priority (P1 ≤ P2 ≤ P3 ≤ P4). */
const dueDaysSchema = z.object({ 1: days, 2: days, 3: days, 4: days }).superRefine((d, ctx) => {
  for (const p of [2, 3, 4] as const) {
    const before = (p - 1) as Priority;
    if (d[p] < d[before]) {
      ctx.addIssue({
        code: 'custom',
        path: [String(p)],
        message: `${PRIORITY_LABELS[p]} must be at least ${d[before]} days, like ${PRIORITY_LABELS[before]}: a lower priority is never due sooner`,
      });
    }
  }
});
export const organisationSettingsSchema = z.object({
  dueDays: dueDaysSchema,
  /** keep GPS and other location metadata in uploaded photos (off: it is stripped) */
  keepPhotoLocation: z.boolean(),
});
export type OrganisationSettings = z.infer<typeof organisationSettingsSchema>;
export const DEFAULT_SETTINGS: OrganisationSettings = { dueDays: DEFAULT_DUE_DAYS, keepPhotoLocation: false };
export const organisationSettingsPatch = organisationSettingsSchema.partial().strict();
