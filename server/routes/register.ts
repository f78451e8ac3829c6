import { Router } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import {
  buildingCreateBody,
  buildingPatchBody,
  circuitCreateBody,
  circuitPatchBody,
  idParams,
  panelCreateBody,
  panelPatchBody,
} from '../../shared/schemas';
import type { Actor } from '../auth/access';
import { requireUser } from '../auth/session';
import { handle } from '../http/handle';
import { serverStamp } from '../services/clock';
import { readPanel } from '../services/panel-read';
import { writeContext, type WriteContext } from '../sync/context';
import { createBuilding, deleteBuilding, patchBuilding } from '../sync/kinds/building';
import { createCircuit, deleteCircuit, patchCircuit } from '../sync/kinds/circuit';
import { createPanel, deletePanel, patchPanel } from '../sync/kinds/panel';
import { getBuilding, listBuildings } from '../sync/reads';

/**
 * REST routes of the register, kept for scripts and integrations; the app's own writes go through
 * the sync push, which calls the same kind handlers (server/sync/kinds).
 */
export function registerRouter(ds: DataSource): Router {
  const router = Router();
  router.use(requireUser(ds));

  // one transaction and one fresh server stamp per request: the stamp sorts after every stamp
  // the server has accepted, so a REST write wins the per-field merge like a plain update
  const write = <T>(actor: Actor, fn: (w: WriteContext) => Promise<T>) =>
    ds.transaction((em: EntityManager) => fn(writeContext(em, actor, serverStamp(), 'server')));

  router.get('/buildings', handle({}, async (_i, req) => listBuildings(ds.manager, req.actor)));
  router.get(
    '/buildings/:id',
    handle({ params: idParams }, async ({ params }, req) => getBuilding(ds.manager, req.actor, params.id)),
  );
  router.post(
    '/buildings',
    handle(
      { body: buildingCreateBody },
      async ({ body }, req) => write(req.actor, (w) => createBuilding(w, body)),
      201,
    ),
  );
  router.patch(
    '/buildings/:id',
    handle({ params: idParams, body: buildingPatchBody }, async ({ params, body }, req) =>
      write(req.actor, (w) => patchBuilding(w, params.id, body)),
    ),
  );
  router.delete(
    '/buildings/:id',
    handle({ params: idParams }, async ({ params }, req) =>
      write(req.actor, (w) => deleteBuilding(w, params.id)),
    ),
  );

  router.post(
    '/buildings/:id/panels',
    handle(
      { params: idParams, body: panelCreateBody },
      async ({ params, body }, req) => write(req.actor, (w) => createPanel(w, params.id, body)),
      201,
    ),
  );
  router.get(
    '/panels/:id',
    handle({ params: idParams }, async ({ params }, req) => readPanel(ds.manager, req.actor, params.id)),
  );
  router.patch(
    '/panels/:id',
    handle({ params: idParams, body: panelPatchBody }, async ({ params, body }, req) =>
      write(req.actor, (w) => patchPanel(w, params.id, body)),
    ),
  );
  router.delete(
    '/panels/:id',
    handle({ params: idParams }, async ({ params }, req) =>
      write(req.actor, (w) => deletePanel(w, params.id)),
    ),
  );

  router.post(
    '/panels/:id/circuits',
    handle(
      { params: idParams, body: circuitCreateBody },
      async ({ params, body }, req) => write(req.actor, (w) => createCircuit(w, params.id, body)),
      201,
    ),
  );
  router.patch(
    '/circuits/:id',
    handle({ params: idParams, body: circuitPatchBody }, async ({ params, body }, req) =>
      write(req.actor, (w) => patchCircuit(w, params.id, body)),
    ),
  );
  router.delete(
    '/circuits/:id',
    handle({ params: idParams }, async ({ params }, req) =>
      write(req.actor, (w) => deleteCircuit(w, params.id)),
    ),
  );

  return router;
}
