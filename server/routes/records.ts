import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { bandCreateBody, bandPatchBody, organisationSettingsPatch } from '../../shared/records';
import { idParams } from '../../shared/schemas';
import { requireUser } from '../auth/session';
import { handle } from '../http/handle';
import { loadInspection } from '../services/inspection-record';
import { recordDto } from '../services/serialise';
import { patchSettings } from '../services/settings';
import { createBand, deleteBand, listBands, patchBand } from '../sync/kinds/band';

/**
 * REST of the condition record: the organisation's time-current band library, an inspection with
 * its readings judged by shared/assess.ts, and the organisation's settings. Rows of the record
 * themselves are written through the sync push. Routes parse and call the services.
 */
export function recordsRouter(ds: DataSource): Router {
  const router = Router();
  router.use(requireUser(ds));

  router.get('/bands', handle({}, async (_i, req) => listBands(ds.manager, req.actor)));
  router.post(
    '/bands',
    handle(
      { body: bandCreateBody.extend({ organisationId: idParams.shape.id.optional() }) },
      async ({ body }, req) => createBand(ds.manager, req.actor, body),
      201,
    ),
  );
  router.patch(
    '/bands/:id',
    handle({ params: idParams, body: bandPatchBody }, async ({ params, body }, req) =>
      patchBand(ds.manager, req.actor, params.id, body),
    ),
  );
  router.delete(
    '/bands/:id',
    handle({ params: idParams }, async ({ params }, req) => deleteBand(ds.manager, req.actor, params.id)),
  );

  router.get(
    '/inspections/:id',
    handle({ params: idParams }, async ({ params }, req) => {
      const record = await loadInspection(ds.manager, req.actor, params.id);
      return {
        inspection: recordDto(record.inspection),
        readings: record.readings.map(({ reading, assessment }) => ({ ...recordDto(reading), assessment })),
        deficiencies: record.deficiencies.map(recordDto),
        photos: record.photos.map(recordDto),
      };
    }),
  );

  router.patch(
    '/organisations/:id/settings',
    handle({ params: idParams, body: organisationSettingsPatch }, async ({ params, body }, req) =>
      patchSettings(ds.manager, req.actor, params.id, body),
    ),
  );

  return router;
}
