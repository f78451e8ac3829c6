/**
 * What a user may do on an inspection and the writes behind it: ticking the visual checklist (a
 * reading and, for those who raise them, a deficiency), raising a deficiency from a reading, and
 * the sign-off. Every write is queued on the device (hooks/use-records.ts), so all of it works offline.
 */
import { useMembership, useRecordWrites } from '@/hooks/use-records';
import { confirmAction } from '@/lib/confirm';
import type { BuildingView } from '@/hooks/building-view';
import type { Assessment } from '@/shared/assess';
import { dueOnFor, todayISO } from '@/shared/deficiency';
import { VISUAL_CHECKS, type Inspection, type Priority, type Reading, type VisualCheck } from '@/shared/records';
import {
  deficiencyTitleFor,
} from './inspection-format';
import { can } from '@/shared/permissions';

/** An empty reading of a kind: every field the create body knows, unset. */
export function blankReading(inspectionId: string, panelId: string, kind: Reading['kind']) {
  return {
    inspectionId,
    panelId,
    kind,
    circuitId: null,
    notes: '',
    component: null,
    phase: null,
    temperatureC: null,
    referenceC: null,
    referenceBasis: null,
    loadA: null,
    referenceLoadA: null,
    duringTestPulse: false,
    emissivity: null,
    reflectedC: null,
    distanceM: null,
    camera: '',
    fastener: '',
    specified: null,
    unit: null,
    specSource: null,
    conductorSize: null,
    screw: null,
    screwSize: null,
    asFound: null,
    asFoundValue: null,
    asLeft: null,
    testCurrentA: null,
    tripped: null,
    tripTimeS: null,
    bandId: null,
    check: null,
  } satisfies Omit<Reading, 'id' | 'buildingId' | 'version' | 'updatedAt' | 'updatedBy' | 'deletedAt'>;
}

export function useInspectionActions(view: BuildingView | undefined, inspection: Inspection | undefined) {
  const writes = useRecordWrites();
  const membership = useMembership(view?.building.organisationId);
  const role = view?.building.role;
  const signed = !!inspection?.signedAt;
  const canRecord = can(role, 'inspection.record', { signed });
  const canRaise = can(role, 'deficiency.raise');
  const buildingId = view?.building.id ?? '';

  const dueOn = (priority: Priority) => dueOnFor(priority, todayISO(), membership?.settings.dueDays);

  /** Raise a deficiency from a saved reading, prefilled from what the reading found. */
  const raiseFromReading = (reading: Reading, assessment: Assessment): string | null => {
    if (!view || !inspection || !canRaise || assessment.priority === null) return null;
    const circuit = reading.circuitId ? (view.circuit(reading.circuitId) ?? null) : null;
    const panel = view.panel(reading.panelId);
    const tripVerdict = assessment.kind === 'trip' ? (assessment.result?.verdict ?? null) : null;
    return writes.raiseDeficiency(buildingId, {
      panelId: reading.panelId,
      circuitId: reading.circuitId,
      inspectionId: inspection.id,
      readingId: reading.id,
      source: 'reading',
      check: null,
      title: deficiencyTitleFor(reading, panel, circuit, tripVerdict),
      description: `${assessment.summary}\nBasis: ${assessment.basis}`,
      priority: assessment.priority,
      priorityReason: '',
      dueOn: dueOn(assessment.priority),
      status: 'open',
      assigneeId: null,
      repairNote: '',
      deferReason: '',
      reviewOn: null,
      acceptedAt: null,
    });
  };

  /** Tick a checklist item: a visual reading, and a deficiency when this role raises them. */
  const tick = (panelId: string, check: VisualCheck) => {
    if (!inspection || !canRecord) return;
    const readingId = writes.createReading(buildingId, { ...blankReading(inspection.id, panelId, 'visual'), check });
    if (!canRaise) return;
    const { label, priority } = VISUAL_CHECKS[check];
    writes.raiseDeficiency(buildingId, {
      panelId,
      circuitId: null,
      inspectionId: inspection.id,
      readingId,
      source: 'checklist',
      check,
      title: label,
      description: '',
      priority,
      priorityReason: '',
      dueOn: dueOn(priority),
      status: 'open',
      assigneeId: null,
      repairNote: '',
      deferReason: '',
      reviewOn: null,
      acceptedAt: null,
    });
  };

  /** Untick: the visual reading goes (after a confirm); a deficiency it raised stays. */
  const untick = async (reading: Reading, raisedDeficiency: boolean) => {
    if (!canRecord) return;
    const label = reading.check ? VISUAL_CHECKS[reading.check].label : 'this finding';
    const ok = await confirmAction(
      'Untick this item?',
      `“${label}” is taken off the checklist.${raisedDeficiency ? ' The deficiency it raised stays: close or change it on its own screen.' : ''}`,
      'Untick',
    );
    if (ok) writes.deleteReading(buildingId, reading.id);
  };

  const sign = async () => {
    if (!inspection || !can(role, 'inspection.sign', { signed })) return;
    const ok = await confirmAction(
      'Sign this inspection?',
      'Signing freezes this inspection; later changes need a new inspection.',
      'Sign',
    );
    if (ok) writes.signInspection(buildingId, inspection.id);
  };

  return {
    role,
    myId: membership?.userId ?? null,
    signed,
    /** may add, change and delete readings here (not signed, and a field worker) */
    canRecord,
    canRaise,
    canSign: can(role, 'inspection.sign', { signed }),
    raiseFromReading,
    tick,
    untick,
    sign,
    writes,
    buildingId,
  };
}
