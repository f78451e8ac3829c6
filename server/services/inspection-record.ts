import { In, IsNull, type EntityManager } from 'typeorm';
import { assessReading, type Assessment } from '../../shared/assess';
import type { Role } from '../../shared/domain';
import type { TemperatureUnit } from '../../shared/units';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Circuit, CurveBand, Deficiency, Inspection, Panel, Photo, Reading } from '../entities';
import { NotFoundError } from '../http/errors';

const live = { deletedAt: IsNull() };

/** An inspection with everything its screen and its report show. */
export interface InspectionRecord {
  inspection: Inspection;
  building: Building;
  role: Role;
  /** the inspection's panels */
  panels: Panel[];
  panelById: Map<string, Panel>;
  /** the live circuits of its panels, in position order */
  circuits: Circuit[];
  /** the live circuits of its panels, plus any other a reading names */
  circuitById: Map<string, Circuit>;
  /** readings in id order, each judged by shared/assess.ts */
  readings: { reading: Reading; circuit: Circuit | undefined; assessment: Assessment; band: CurveBand | null }[];
  /** deficiencies it raised, by priority then id */
  deficiencies: Deficiency[];
  /** photos of its readings and deficiencies, in the order taken */
  photos: Photo[];
}

/**
 * The one loader of an inspection with its readings, their assessments, its deficiencies and
 * photos: GET /api/inspections/:id and the report PDF read the same thing the same way. Not found
 * when the actor may not see the building.
 */
export async function loadInspection(
  em: EntityManager,
  actor: Actor,
  inspectionId: string,
  /** the unit the assessments' summaries write temperatures in (the report's reader's choice) */
  temperatureUnit: TemperatureUnit = 'C',
): Promise<InspectionRecord> {
  const inspection = await em.findOne(Inspection, { where: { id: inspectionId, ...live } });
  const building = inspection && (await em.findOne(Building, { where: { id: inspection.buildingId, ...live } }));
  const role = building && roleForBuilding(actor, building);
  if (!inspection || !building || !role) throw new NotFoundError('Inspection');

  const readings = await em.find(Reading, { where: { inspectionId: inspection.id, ...live }, order: { id: 'ASC' } });
  const panels = inspection.panelIds.length ? await em.find(Panel, { where: { id: In(inspection.panelIds) } }) : [];
  const ofPanels = inspection.panelIds.length
    ? await em.find(Circuit, { where: { panelId: In(inspection.panelIds), ...live }, order: { position: 'ASC' } })
    : [];
  const listed = new Set(ofPanels.map((c) => c.id));
  const extraIds = readings.map((r) => r.circuitId).filter((c): c is string => !!c && !listed.has(c));
  const extra = extraIds.length ? await em.find(Circuit, { where: { id: In(extraIds) } }) : [];
  const circuitById = new Map([...ofPanels, ...extra].map((c) => [c.id, c]));
  const bandIds = [...readings.map((r) => r.bandId), ...[...circuitById.values()].map((c) => c.bandId)].filter(
    (b): b is string => !!b,
  );
  // only the building's own organisation's bands: a link to another's is never judged on
  const bands = bandIds.length
    ? await em.find(CurveBand, { where: { id: In(bandIds), organisationId: building.organisationId } })
    : [];
  const bandById = new Map(bands.map((b) => [b.id, b]));
  const deficiencies = await em.find(Deficiency, {
    where: { inspectionId: inspection.id, ...live },
    order: { priority: 'ASC', id: 'ASC' },
  });
  const parentIds = [...readings.map((r) => r.id), ...deficiencies.map((d) => d.id)];
  const photos = parentIds.length
    ? await em.find(Photo, { where: { parentId: In(parentIds), ...live }, order: { takenAt: 'ASC', id: 'ASC' } })
    : [];
  const panelById = new Map(panels.map((p) => [p.id, p]));
  return {
    inspection,
    building,
    role,
    panels,
    panelById,
    circuits: ofPanels,
    circuitById,
    readings: readings.map((reading) => {
      const circuit = reading.circuitId ? circuitById.get(reading.circuitId) : undefined;
      const bandId = reading.bandId ?? circuit?.bandId;
      const band = (bandId && bandById.get(bandId)) || null;
      const assessment = assessReading(reading, { circuit, panel: panelById.get(reading.panelId), band, temperatureUnit });
      return { reading, circuit, assessment, band };
    }),
    deficiencies,
    photos,
  };
}
