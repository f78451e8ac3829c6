/**
 * The condition record on the device: inspections and readings, deficiencies with their history,
 * recorded trips and photo rows, read from the replica (so they work offline), and their writes,
 * queued through the outbox like every other change. The band library is a REST query kept in the
 * persisted cache.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback } from 'react';
import { uuidv7 } from 'uuidv7';
import { api } from '@/lib/api';
import { EMPTY_REPLICA, recordsOf, type BuildingCopy, type RecordCopy, type Replica } from '@/lib/replica';
import { assessReading, terminationReadingOf, type Assessment } from '@/shared/assess';
import { isOutstanding } from '@/shared/deficiency';
import { nuisanceTripFindings, type TerminationReading } from '@/shared/calc';
import type { TemperatureUnit } from '@/shared/units';
import { useTemperatureUnit } from './use-temperature-unit';
import {
  bandResponse,
  bandsResponse,
  type Band,
  type BandCreateBody,
  type Deficiency,
  type DeficiencyCreateBody,
  type DeficiencyPatchBody,
  type InspectionCreateBody,
  type InspectionPatchBody,
  type PhotoCreateBody,
  type Reading,
  type ReadingCreateBody,
  type ReadingPatchBody,
  type TripCreateBody,
  type TripPatchBody,
} from '@/shared/records';
import type { Membership, MeResponse } from '@/shared/schemas';
import type { Mutation, RecordList } from '@/shared/sync';
import { viewOf, type BuildingView } from './building-view';
import { keys } from './keys';
import { useEnqueue } from './use-outbox';

function useReplica<T>(select: (r: Replica) => T) {
  return useQuery({ queryKey: keys.replica, select });
}

function list<L extends RecordList>(copy: BuildingCopy, name: L): RecordCopy[L][string][] {
  return Object.values(recordsOf(copy, name)) as RecordCopy[L][string][];
}

/** The copy holding a row of a record list. */
function copyWith(r: Replica, name: RecordList, id: string): BuildingCopy | null {
  for (const copy of Object.values(r.buildings)) if (recordsOf(copy, name)[id]) return copy;
  return null;
}

// ---------- the band library ----------

export function useBands() {
  return useQuery({
    queryKey: keys.bands,
    queryFn: async () => (await api.get('/bands', bandsResponse)).bands,
    staleTime: 10 * 60_000,
    networkMode: 'offlineFirst',
  });
}

/** Bands are kept in the office library: adding one needs a connection (the form says so). */
export function useSaveBand() {
  const queryClient = useQueryClient();
  return useMutation({
    // fail at once with no signal (the default would wait for it): the form keeps the draft
    networkMode: 'always',
    mutationFn: (body: BandCreateBody & { id?: string }) => api.post('/bands', body, bandResponse),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: keys.bands }),
  });
}

// ---------- who am I here ----------

/** The signed-in user's membership of the organisation a building belongs to. */
export function useMembership(organisationId: string | undefined): (Membership & { userId: string }) | null {
  const me = useQuery<MeResponse | null>({ queryKey: keys.me, enabled: false }).data;
  const membership = me?.memberships.find((m) => m.organisationId === organisationId);
  return membership && me ? { ...membership, userId: me.user.id } : null;
}

// ---------- readings and inspections ----------

export interface AssessedReading {
  reading: Reading;
  assessment: Assessment;
}

/** Judge a reading against what the device holds (its circuit, panel and band). */
export function assessOnDevice(view: BuildingView, reading: Reading, bands: readonly Band[] | undefined, temperatureUnit: TemperatureUnit = 'C'): Assessment {
  const circuit = reading.circuitId ? view.circuit(reading.circuitId) : null;
  const bandId = reading.bandId ?? circuit?.bandId ?? null;
  const context = { circuit, panel: view.panel(reading.panelId), temperatureUnit };
  try {
    return assessReading(reading, { ...context, band: bandId ? bands?.find((b) => b.id === bandId) : null });
  } catch {
    // a band the computations cannot use (stored before the schema tightened): judge without it
    return assessReading(reading, { ...context, band: null });
  }
}

export function useInspections(buildingId: string) {
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = r.buildings[buildingId];
        if (!copy) return [];
        return list(copy, 'inspections').sort((a, b) => b.performedOn.localeCompare(a.performedOn) || b.id.localeCompare(a.id));
      },
      [buildingId],
    ),
  );
}

/** `null` when the inspection is not on this device. */
export function useInspection(inspectionId: string) {
  const bands = useBands().data;
  const { unit } = useTemperatureUnit();
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = copyWith(r, 'inspections', inspectionId);
        if (!copy) return null;
        const inspection = recordsOf(copy, 'inspections')[inspectionId];
        const readings = list(copy, 'readings')
          .filter((x) => x.inspectionId === inspectionId)
          .sort((a, b) => a.id.localeCompare(b.id))
          .map((reading) => ({ reading, assessment: assessOnDevice(viewOf(copy), reading, bands, unit) }));
        const deficiencies = list(copy, 'deficiencies').filter((d) => d.inspectionId === inspectionId);
        const panels = inspection.panelIds.map((id) => copy.panels[id]).filter(Boolean);
        return { inspection, readings, deficiencies, panels, view: viewOf(copy) };
      },
      [inspectionId, bands, unit],
    ),
  );
}

// ---------- deficiencies ----------

export interface DeficiencyRow {
  deficiency: Deficiency;
  view: BuildingView;
  /** photos of the deficiency on the device */
  photoCount: number;
}

/** Every deficiency on the device, across buildings. */
export function useAllDeficiencies() {
  return useReplica(
    useCallback(
      (r: Replica): DeficiencyRow[] =>
        Object.values(r.buildings).flatMap((copy) => {
          const photos = list(copy, 'photos');
          return list(copy, 'deficiencies').map((deficiency) => ({
            deficiency,
            view: viewOf(copy),
            photoCount: photos.filter((p) => p.parentId === deficiency.id).length,
          }));
        }),
      [],
    ),
  );
}

/** Outstanding ones first by due date (overdue first), then by priority. */
export function byUrgency(a: Deficiency, b: Deficiency): number {
  const open = Number(isOutstanding(b.status)) - Number(isOutstanding(a.status));
  return open || a.dueOn.localeCompare(b.dueOn) || a.priority - b.priority;
}

/** `null` when the deficiency is not on this device. */
export function useDeficiency(deficiencyId: string) {
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = copyWith(r, 'deficiencies', deficiencyId);
        if (!copy) return null;
        const deficiency = recordsOf(copy, 'deficiencies')[deficiencyId];
        const entries = list(copy, 'entries')
          .filter((e) => e.deficiencyId === deficiencyId)
          .sort((a, b) => a.at.localeCompare(b.at) || a.id.localeCompare(b.id));
        const photos = list(copy, 'photos').filter((p) => p.parentId === deficiencyId);
        const reading = deficiency.readingId ? (recordsOf(copy, 'readings')[deficiency.readingId] ?? null) : null;
        return {
          deficiency,
          entries,
          photos,
          reading,
          view: viewOf(copy),
          panel: deficiency.panelId ? (copy.panels[deficiency.panelId] ?? null) : null,
          circuit: deficiency.circuitId ? (copy.circuits[deficiency.circuitId] ?? null) : null,
        };
      },
      [deficiencyId],
    ),
  );
}

// ---------- a circuit's record ----------

/**
 * A circuit's trips, its recent readings and what they say together (nuisanceTripFindings): the
 * one place where the trip history, the lug's thermal reading and its torque record sit side by side.
 */
export function useCircuitRecord(circuitId: string) {
  const bands = useBands().data;
  const { unit } = useTemperatureUnit();
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = Object.values(r.buildings).find((c) => c.circuits[circuitId]);
        if (!copy) return null;
        const circuit = copy.circuits[circuitId];
        const trips = list(copy, 'trips')
          .filter((t) => t.circuitId === circuitId)
          .sort((a, b) => b.occurredAt.localeCompare(a.occurredAt));
        const readings = list(copy, 'readings')
          .filter((x) => x.circuitId === circuitId)
          .sort((a, b) => b.id.localeCompare(a.id))
          .map((reading) => ({ reading, assessment: assessOnDevice(viewOf(copy), reading, bands, unit) }));
        // the judged rise: a test-pulse reading at its raw difference, a too-light one not at all
        const terminations: TerminationReading[] = readings.flatMap(({ reading, assessment }) => {
          const t = terminationReadingOf(reading, assessment);
          return t ? [t] : [];
        });
        const findings = circuit.ratingA
          ? nuisanceTripFindings({
              ratingA: circuit.ratingA,
              trips: trips.map((t) => ({ at: t.occurredAt, loadA: t.loadA })),
              readings: terminations,
            })
          : null;
        const deficiencies = list(copy, 'deficiencies').filter((d) => d.circuitId === circuitId);
        return { circuit, trips, readings, findings, deficiencies, view: viewOf(copy) };
      },
      [circuitId, bands, unit],
    ),
  );
}

// ---------- writes ----------

type Kind = 'inspection' | 'reading' | 'deficiency' | 'trip' | 'photo';

/** Every write of the condition record, queued on the device (returns the new row's id). */
export function useRecordWrites() {
  const enqueue = useEnqueue();
  const queryClient = useQueryClient();
  const versionOf = (buildingId: string, list: RecordList, id: string) => {
    const copy = (queryClient.getQueryData<Replica>(keys.replica) ?? EMPTY_REPLICA).buildings[buildingId];
    return copy ? ((recordsOf(copy, list)[id] as { version?: number } | undefined)?.version ?? 0) : 0;
  };
  const LISTS = { inspection: 'inspections', reading: 'readings', deficiency: 'deficiencies', trip: 'trips', photo: 'photos' } as const;
  const create = (kind: Kind, buildingId: string, fields: object, id = uuidv7()) => {
    enqueue({ name: `${kind}.create` as Mutation['name'], buildingId, entityId: id, baseVersion: 0, fields: fields as Record<string, unknown> });
    return id;
  };
  const patch = (kind: Kind, buildingId: string, id: string, fields: object) =>
    enqueue({
      name: `${kind}.patch` as Mutation['name'],
      buildingId,
      entityId: id,
      baseVersion: versionOf(buildingId, LISTS[kind], id),
      fields: fields as Record<string, unknown>,
    });
  const remove = (kind: Kind, buildingId: string, id: string) =>
    enqueue({ name: `${kind}.delete` as Mutation['name'], buildingId, entityId: id, baseVersion: versionOf(buildingId, LISTS[kind], id), fields: {} });
  return {
    createInspection: (buildingId: string, fields: InspectionCreateBody) => create('inspection', buildingId, fields),
    patchInspection: (buildingId: string, id: string, fields: InspectionPatchBody) => patch('inspection', buildingId, id, fields),
    signInspection: (buildingId: string, id: string) =>
      enqueue({ name: 'inspection.sign', buildingId, entityId: id, baseVersion: versionOf(buildingId, 'inspections', id), fields: {} }),
    deleteInspection: (buildingId: string, id: string) => remove('inspection', buildingId, id),
    createReading: (buildingId: string, fields: ReadingCreateBody) => create('reading', buildingId, fields),
    patchReading: (buildingId: string, id: string, fields: ReadingPatchBody) => patch('reading', buildingId, id, fields),
    deleteReading: (buildingId: string, id: string) => remove('reading', buildingId, id),
    raiseDeficiency: (buildingId: string, fields: DeficiencyCreateBody) => create('deficiency', buildingId, fields),
    patchDeficiency: (buildingId: string, id: string, fields: DeficiencyPatchBody) => patch('deficiency', buildingId, id, fields),
    deleteDeficiency: (buildingId: string, id: string) => remove('deficiency', buildingId, id),
    comment: (buildingId: string, deficiencyId: string, text: string) => {
      const id = uuidv7();
      enqueue({ name: 'comment.create', buildingId, entityId: id, baseVersion: 0, fields: { deficiencyId, text } });
      return id;
    },
    recordTrip: (buildingId: string, fields: TripCreateBody) => create('trip', buildingId, fields),
    patchTrip: (buildingId: string, id: string, fields: TripPatchBody) => patch('trip', buildingId, id, fields),
    deleteTrip: (buildingId: string, id: string) => remove('trip', buildingId, id),
    /** the photo's row; its bytes go through lib/photo-queue (the id is the queue's key) */
    createPhotoRow: (buildingId: string, id: string, fields: PhotoCreateBody) => create('photo', buildingId, fields, id),
    deletePhoto: (buildingId: string, id: string) => remove('photo', buildingId, id),
  };
}
