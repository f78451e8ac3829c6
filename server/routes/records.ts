import { Router } from 'express';
import { In, IsNull, type DataSource } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { assessReading } from '../../shared/assess';
import {
  bandCreateBody,
  bandPatchBody,
  organisationSettingsPatch,
  type Band,
  type ReadingFields,
} from '../../shared/records';
import { idParams } from '../../shared/schemas';
import { roleForBuilding, type Actor } from '../auth/access';
import { requireUser } from '../auth/session';
import { Building, Circuit, CurveBand, Deficiency, Inspection, Organisation, Panel, Photo, Reading } from '../entities';
import { ForbiddenError, NotFoundError } from '../http/errors';
import { handle } from '../http/handle';
import { recordDto } from '../services/serialise';

const live = { deletedAt: IsNull() };
const BAND_EDITORS = ['admin', 'electrician', 'inspector'];

function bandDto(b: CurveBand): Band {
  return {
    id: b.id,
    organisationId: b.organisationId,
    label: b.label,
    ratingA: b.ratingA,
    source: b.source,
    points: b.points,
    instantaneousMultiple: b.instantaneousMultiple,
    instantaneousTolerancePct: b.instantaneousTolerancePct,
    updatedAt: b.updatedAt.toISOString(),
  };
}

/** The organisation a band is written to: the one named, or the actor's only one that may. */
function bandOrganisation(actor: Actor, requested?: string): string {
  const editable = [...actor.roles].filter(([, role]) => BAND_EDITORS.includes(role)).map(([id]) => id);
  const id = requested ?? (editable.length === 1 ? editable[0] : undefined);
  if (!id || !editable.includes(id)) throw new ForbiddenError('Only admins, electricians and inspectors keep the band library');
  return id;
}

/**
 * REST of the condition record: the organisation's time-current band library, an inspection with
 * its readings judged by shared/assess.ts, and the organisation's settings. Rows of the record
 * themselves are written through the sync push.
 */
export function recordsRouter(ds: DataSource): Router {
  const router = Router();
  router.use(requireUser(ds));

  router.get(
    '/bands',
    handle({}, async (_i, req) => {
      const orgs = [...req.actor.roles.keys()];
      const bands = orgs.length
        ? await ds.manager.find(CurveBand, { where: { organisationId: In(orgs), ...live }, order: { label: 'ASC' } })
        : [];
      return { bands: bands.map(bandDto) };
    }),
  );
  router.post(
    '/bands',
    handle(
      { body: bandCreateBody.extend({ organisationId: idParams.shape.id.optional() }) },
      async ({ body }, req) => {
        const { id, organisationId, ...fields } = body;
        const band = ds.manager.create(CurveBand, {
          ...fields,
          id: id ?? uuidv7(),
          organisationId: bandOrganisation(req.actor, organisationId),
          updatedAt: new Date(),
          deletedAt: null,
        });
        await ds.manager.insert(CurveBand, band);
        return { band: bandDto(band) };
      },
      201,
    ),
  );
  const ownBand = async (actor: Actor, id: string) => {
    const band = await ds.manager.findOne(CurveBand, { where: { id, ...live } });
    if (!band || !actor.roles.has(band.organisationId)) throw new NotFoundError('Band');
    bandOrganisation(actor, band.organisationId);
    return band;
  };
  router.patch(
    '/bands/:id',
    handle({ params: idParams, body: bandPatchBody }, async ({ params, body }, req) => {
      const band = await ownBand(req.actor, params.id);
      Object.assign(band, body, { updatedAt: new Date() });
      await ds.manager.save(CurveBand, band);
      return { band: bandDto(band) };
    }),
  );
  router.delete(
    '/bands/:id',
    handle({ params: idParams }, async ({ params }, req) => {
      const band = await ownBand(req.actor, params.id);
      await ds.manager.update(CurveBand, { id: band.id }, { deletedAt: new Date(), updatedAt: new Date() });
      return { ok: true };
    }),
  );

  router.get(
    '/inspections/:id',
    handle({ params: idParams }, async ({ params }, req) => {
      const inspection = await ds.manager.findOne(Inspection, { where: { id: params.id, ...live } });
      const building = inspection && (await ds.manager.findOne(Building, { where: { id: inspection.buildingId, ...live } }));
      if (!inspection || !building || !roleForBuilding(req.actor, building)) throw new NotFoundError('Inspection');
      const readings = await ds.manager.find(Reading, { where: { inspectionId: inspection.id, ...live }, order: { id: 'ASC' } });
      const panels = await ds.manager.find(Panel, { where: { id: In(inspection.panelIds) } });
      const circuitIds = readings.map((r) => r.circuitId).filter((c): c is string => !!c);
      const circuits = circuitIds.length ? await ds.manager.find(Circuit, { where: { id: In(circuitIds) } }) : [];
      const bandIds = [...readings.map((r) => r.bandId), ...circuits.map((c) => c.bandId)].filter((b): b is string => !!b);
      // only the building's own organisation's bands: a link to another's is never judged on
      const bands = bandIds.length
        ? await ds.manager.find(CurveBand, { where: { id: In(bandIds), organisationId: building.organisationId } })
        : [];
      const deficiencies = await ds.manager.find(Deficiency, { where: { inspectionId: inspection.id, ...live } });
      const parentIds = [...readings.map((r) => r.id), ...deficiencies.map((d) => d.id)];
      const photos = parentIds.length
        ? await ds.manager.find(Photo, { where: { parentId: In(parentIds), ...live } })
        : [];
      const byId = <T extends { id: string }>(rows: T[]) => new Map(rows.map((r) => [r.id, r]));
      const panelById = byId(panels);
      const circuitById = byId(circuits);
      const bandById = byId(bands);
      return {
        inspection: recordDto(inspection),
        readings: readings.map((r) => {
          const circuit = r.circuitId ? circuitById.get(r.circuitId) : undefined;
          const bandId = r.bandId ?? circuit?.bandId;
          return {
            ...recordDto(r),
            assessment: assessReading(r as unknown as ReadingFields, {
              circuit,
              panel: panelById.get(r.panelId),
              band: bandId ? bandById.get(bandId) : null,
            }),
          };
        }),
        deficiencies: deficiencies.map(recordDto),
        photos: photos.map(recordDto),
      };
    }),
  );

  router.patch(
    '/organisations/:id/settings',
    handle({ params: idParams, body: organisationSettingsPatch }, async ({ params, body }, req) => {
      const role = req.actor.roles.get(params.id);
      if (!role) throw new NotFoundError('Organisation');
      if (role !== 'admin') throw new ForbiddenError('Only an admin changes the organisation\u2019s settings');
      const org = await ds.manager.findOneByOrFail(Organisation, { id: params.id });
      org.settings = { ...org.settings, ...body };
      await ds.manager.save(Organisation, org);
      return { settings: org.settings };
    }),
  );

  return router;
}
