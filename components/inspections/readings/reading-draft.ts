/**
 * A reading as the form holds it (numbers as typed) and back, the live judgement of a draft, and
 * the UL 486A-486B fallback torque in the unit chosen. Pure functions.
 */
import { assessReading, type AssessContext, type Assessment } from '@/shared/assess';
import { convertTorque, fallbackTorque, type TorqueUnit } from '@/shared/calc';
import type { ConductorSize } from '@/shared/domain';
import {
  readingCreateBody,
  readingRuleErrors,
  type TORQUE_SCREWS,
  type ReadingCreateBody,
  type ReadingFields,
} from '@/shared/records';
import { fieldErrors } from '@/shared/schemas';
import { numberOrNull, textOf } from '@/components/ui/form-values';
import { parseTempInput, tempInputText, type TemperatureUnit } from '@/shared/units';

type Screw = (typeof TORQUE_SCREWS)[number];

export interface ReadingDraft {
  circuitId: string | null;
  notes: string;
  component: ReadingFields['component'];
  phase: ReadingFields['phase'];
  /** typed in this unit (the user's choice when the form opened); stored in °C */
  temperatureUnit: TemperatureUnit;
  temperatureC: string;
  referenceC: string;
  referenceBasis: ReadingFields['referenceBasis'];
  loadA: string;
  referenceLoadA: string;
  duringTestPulse: boolean;
  emissivity: string;
  reflectedC: string;
  distanceM: string;
  camera: string;
  fastener: string;
  specified: string;
  unit: ReadingFields['unit'];
  specSource: ReadingFields['specSource'];
  conductorSize: ConductorSize | null;
  screw: Screw | null;
  screwSize: ReadingFields['screwSize'];
  asFound: ReadingFields['asFound'];
  asFoundValue: string;
  asLeft: string;
  testCurrentA: string;
  tripped: boolean | null;
  tripTimeS: string;
  bandId: string | null;
}

export function toReadingDraft(r: ReadingFields, unit: TemperatureUnit = 'C'): ReadingDraft {
  return {
    circuitId: r.circuitId,
    notes: r.notes,
    component: r.component,
    phase: r.phase,
    temperatureUnit: unit,
    temperatureC: tempInputText(r.temperatureC, unit, 'absolute'),
    referenceC: tempInputText(r.referenceC, unit, 'absolute'),
    referenceBasis: r.referenceBasis,
    loadA: textOf(r.loadA),
    referenceLoadA: textOf(r.referenceLoadA),
    // a copy persisted before the field existed has none
    duringTestPulse: r.duringTestPulse ?? false,
    emissivity: textOf(r.emissivity),
    reflectedC: textOf(r.reflectedC),
    distanceM: textOf(r.distanceM),
    camera: r.camera ?? '',
    // "main" is the stored name of the main lugs / main breaker, not something the user typed
    fastener: r.fastener === 'main' ? '' : r.fastener,
    specified: textOf(r.specified),
    unit: r.unit,
    specSource: r.specSource,
    conductorSize: r.conductorSize,
    screw: r.screw,
    screwSize: r.screwSize ?? null,
    asFound: r.asFound,
    asFoundValue: textOf(r.asFoundValue),
    asLeft: textOf(r.asLeft),
    testCurrentA: textOf(r.testCurrentA),
    tripped: r.tripped,
    tripTimeS: textOf(r.tripTimeS),
    bandId: r.bandId,
  };
}

/** The reading the draft stands for; fields of other kinds keep what `base` had (null for a new one). */
export function fromReadingDraft(d: ReadingDraft, base: ReadingFields): ReadingFields {
  const common = { ...base, circuitId: d.circuitId, notes: d.notes };
  switch (base.kind) {
    case 'thermal':
      return {
        ...common,
        component: d.component,
        phase: d.phase,
        // typed in the draft's unit; unchanged text keeps the stored °C exactly
        temperatureC: parseTempInput(d.temperatureC, d.temperatureUnit ?? 'C', 'absolute', base.temperatureC),
        referenceC: parseTempInput(d.referenceC, d.temperatureUnit ?? 'C', 'absolute', base.referenceC),
        referenceBasis: d.referenceBasis,
        loadA: numberOrNull(d.loadA),
        referenceLoadA: numberOrNull(d.referenceLoadA),
        duringTestPulse: d.duringTestPulse,
        emissivity: numberOrNull(d.emissivity),
        reflectedC: numberOrNull(d.reflectedC),
        distanceM: numberOrNull(d.distanceM),
        camera: d.camera,
      };
    case 'torque': {
      const fastener = d.fastener.trim();
      return {
        ...common,
        fastener: fastener || (d.circuitId ? '' : 'main'),
        specified: numberOrNull(d.specified),
        unit: d.unit,
        specSource: d.specSource,
        conductorSize: d.conductorSize,
        screw: d.screw,
        // only the kinds whose table goes by slot length or socket size keep one
        screwSize: d.screw === 'socket' || d.screw === 'slotted-under-10-narrow' || d.screw === 'slotted-under-10-wide' ? d.screwSize : null,
        asFound: d.asFound,
        // it held at the specified torque: there is no separate figure to keep
        asFoundValue: d.asFound === 'turned' ? numberOrNull(d.asFoundValue) : null,
        asLeft: numberOrNull(d.asLeft),
      };
    }
    case 'trip':
      return {
        ...common,
        testCurrentA: numberOrNull(d.testCurrentA),
        tripped: d.tripped,
        tripTimeS: d.tripped ? numberOrNull(d.tripTimeS) : null,
        bandId: d.bandId,
      };
    case 'visual':
      return common;
  }
}

/** Check a reading: the parsed body, or the message of every field that needs attention. */
export function checkReading(candidate: ReadingFields): { ok: true; body: ReadingCreateBody } | { ok: false; errors: Record<string, string> } {
  const parsed = readingCreateBody.safeParse(candidate);
  if (parsed.success) return { ok: true, body: parsed.data };
  // the rules between fields run only once every field parses: name both kinds of problem at once
  return { ok: false, errors: { ...readingRuleErrors(candidate), ...fieldErrors(parsed.error) } };
}

/** The live judgement of a draft, or the fields still missing before there is one. */
export function liveAssessment(
  candidate: ReadingFields,
  ctx: AssessContext,
): { assessment: Assessment; missing: null } | { assessment: null; missing: string[] } {
  const checked = checkReading(candidate);
  if (!checked.ok) {
    // what is still to be given reads as a to-do; a malformed number is named at the save
    const rules = Object.values(readingRuleErrors(candidate));
    return { assessment: null, missing: rules.length > 0 ? rules : ['correct the fields that are not numbers'] };
  }
  try {
    return { assessment: assessReading(checked.body, ctx), missing: null };
  } catch (error) {
    return { assessment: null, missing: [(error as Error).message] };
  }
}

/**
 * The UL 486A-486B fallback value (NEC Informative Annex I) for a wire size and screw kind, in
 * the unit the form uses; null where the table has none.
 */
export function fallbackIn(unit: TorqueUnit, size: ConductorSize | null, screw: Screw | null, screwSize: string | null = null): number | null {
  if (!size || !screw) return null;
  const value = fallbackTorque({ size, screw, screwSize });
  if (!value) return null;
  if (unit === 'lbf-in') return value.lbfIn;
  if (unit === 'N·m') return value.nm;
  return Math.round(convertTorque(value.lbfIn, 'lbf-in', 'lbf-ft') * 100) / 100;
}
