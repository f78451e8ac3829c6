/**
 * The arc-flash label of a panel: what the arc-flash study found for it, as its label shows it.
 * A synced row of the building like a recorded trip (made on the device, pushed, pulled); a panel
 * may carry several (a newer study does not erase the older one), and the screens show the
 * latest by study date.
 *
 * What a label carries follows NFPA 70E 130.5(H) [2021 ed., shared/REFERENCES.md, V]: the
 * nominal voltage, the arc-flash boundary, and either the available incident energy with its
 * working distance or the PPE category — not both. The study is reviewed at intervals of no more
 * than 5 years: 130.5(G) [2021 ed., REFERENCES.md, V; the 2024 ed. keeps the 5 years — its
 * paragraph letter from memory].
 */
import { z } from 'zod';
import { idSchema, syncColumns } from './schemas';
import { isoDate, requiredText } from './text';

export const PPE_CATEGORIES = [1, 2, 3, 4] as const;
/** Years between the study and its review (NFPA 70E 130.5(G), see above). */
export const ARC_FLASH_REVIEW_YEARS = 5;

const number = (what: string) => z.number({ error: `must be a number of ${what}` });

const arcFlashFieldsBase = z.object({
  panelId: idSchema,
  /** the day the study (the incident energy analysis) was done */
  studyDate: isoDate,
  /** available incident energy at the working distance, cal/cm²; null when the label gives a PPE category */
  incidentEnergyCalCm2: number('cal/cm²').min(0, 'cannot be negative').max(1000, 'at most 1000 cal/cm²').nullable(),
  /** PPE category 1–4 (NFPA 70E Table 130.7(C)(15)(c), from memory); null when the label gives the energy */
  ppeCategory: z
    .number({ error: 'a PPE category 1–4' })
    .int('a PPE category 1–4')
    .min(1, 'a PPE category 1–4')
    .max(4, 'a PPE category 1–4')
    .nullable(),
  /** arc-flash boundary, inches */
  boundaryIn: number('inches').positive('must be more than 0').max(12000, 'at most 12000 in'),
  /** working distance the energy was calculated at, inches */
  workingDistanceIn: number('inches').positive('must be more than 0').max(1200, 'at most 1200 in'),
  /** nominal system voltage, volts */
  nominalV: number('volts').positive('must be more than 0').max(100000, 'at most 100000 V'),
  /** who did the study: the engineer or the firm */
  studyBy: requiredText(200, 'who did the study'),
});

/** The fields of a label as stored (what a row and a create carry). */
export type ArcFlashFields = z.infer<typeof arcFlashFieldsBase>;

/** The latest day a study may carry: today where the day is furthest ahead (UTC+14), from the UTC clock. */
export function latestStudyDate(now: Date = new Date()): string {
  return new Date(now.getTime() + 14 * 3_600_000).toISOString().slice(0, 10);
}

/**
 * The rules across fields, field by field (empty when the label holds): one of incident energy
 * and PPE category, not both (130.5(H), see above), and a study not after `latest`.
 */
export function arcFlashProblems(
  f: Pick<ArcFlashFields, 'incidentEnergyCalCm2' | 'ppeCategory' | 'studyDate'>,
  latest: string = latestStudyDate(),
): Record<string, string> {
  const out: Record<string, string> = {};
  if (f.incidentEnergyCalCm2 === null && f.ppeCategory === null) {
    out.incidentEnergyCalCm2 = 'enter the incident energy or the PPE category';
    out.ppeCategory = 'enter the PPE category or the incident energy';
  } else if (f.incidentEnergyCalCm2 !== null && f.ppeCategory !== null) {
    out.ppeCategory = 'a label gives the incident energy or the PPE category, not both';
  }
  if (f.studyDate > latest) out.studyDate = 'cannot be in the future';
  return out;
}

function refineLabel(f: ArcFlashFields, ctx: z.RefinementCtx): void {
  for (const [field, message] of Object.entries(arcFlashProblems(f))) ctx.addIssue({ code: 'custom', path: [field], message });
}

export const arcFlashCreateBody = arcFlashFieldsBase
  .extend({
    incidentEnergyCalCm2: arcFlashFieldsBase.shape.incidentEnergyCalCm2.default(null),
    ppeCategory: arcFlashFieldsBase.shape.ppeCategory.default(null),
  })
  .superRefine(refineLabel);
/**
 * A patch names what changes (no defaults); the label it leaves is checked on the server as
 * stored after the merge (server/sync/kinds/arc-flash.ts), since a field alone cannot say.
 */
export const arcFlashPatchBody = arcFlashFieldsBase
  .omit({ panelId: true })
  .partial()
  .strict()
  .superRefine((f, ctx) => {
    if (f.studyDate !== undefined && f.studyDate > latestStudyDate()) {
      ctx.addIssue({ code: 'custom', path: ['studyDate'], message: 'cannot be in the future' });
    }
  });
export type ArcFlashCreateBody = z.infer<typeof arcFlashCreateBody>;
export type ArcFlashPatchBody = z.infer<typeof arcFlashPatchBody>;

export const arcFlashLabelSchema = z.object({ ...syncColumns, buildingId: z.string(), ...arcFlashFieldsBase.shape });
export type ArcFlashLabel = z.infer<typeof arcFlashLabelSchema>;

/**
 * The day the study is due for review: the same day five years on (NFPA 70E 130.5(G), see
 * above). 29 February falls back to 28 February, so a review is never later than five years [CP].
 */
export function arcFlashReviewDue(studyDate: string): string {
  const [y, m, d] = studyDate.split('-').map(Number);
  const year = y + ARC_FLASH_REVIEW_YEARS;
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  const day = m === 2 && d === 29 && !leap ? 28 : d;
  return `${String(year).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/** Past its review day (`today` as YYYY-MM-DD, the device's calendar day). */
export function arcFlashOverdue(studyDate: string, today: string): boolean {
  return arcFlashReviewDue(studyDate) < today;
}

/** The label the panel shows: the latest study (by date, then the later write). */
export function currentLabel(labels: readonly ArcFlashLabel[]): ArcFlashLabel | undefined {
  return [...labels].sort((a, b) => (a.studyDate === b.studyDate ? a.updatedAt.localeCompare(b.updatedAt) : a.studyDate.localeCompare(b.studyDate))).at(-1);
}
