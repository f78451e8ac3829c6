import { Router, type Request, type Response } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { idParams } from '../../shared/schemas';
import { requireUser } from '../auth/session';
import type { Config } from '../config';
import { handle } from '../http/handle';
import { directoryPdf } from '../services/pdf/directory';
import { inspectionReportPdf } from '../services/pdf/report';
import type { PhotoStore } from '../services/photo-store';

const directoryQuery = z.object({
  paper: z.enum(['letter', 'a4'], { error: 'paper: letter or a4' }).default('letter'),
});

/** The reader's temperature unit (the app sends its user's choice; values are stored in °C). */
const reportQuery = z.object({
  temperature: z.enum(['C', 'F'], { error: 'temperature: C or F' }).default('C'),
});

function sendPdf(res: Response, { filename, pdf }: { filename: string; pdf: Buffer }): void {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `inline; filename="${filename}"`);
  // the schedule changes: never print from a stale copy
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200).end(pdf);
}

/** The origin the printed QR code opens: PUBLIC_URL, else the host this request came to. */
function originOf(req: Request, publicUrl: string | undefined): string {
  return publicUrl ?? `${req.protocol}://${req.get('host')}`;
}

/**
 * Printed documents: the panel door's circuit directory (NEC 408.4(A)) and the inspection report.
 * Read rights as for the register: a panel or inspection the user may not see is not found.
 */
export function documentsRouter(
  ds: DataSource,
  store: PhotoStore,
  config: Pick<Config, 'TRUST_PROXY'> & Partial<Pick<Config, 'PUBLIC_URL'>>,
): Router {
  const router = Router();
  router.use(['/panels/:id/directory.pdf', '/inspections/:id/report.pdf'], requireUser(ds));
  router.get(
    '/panels/:id/directory.pdf',
    handle({ params: idParams, query: directoryQuery }, async ({ params, query }, req, res) => {
      sendPdf(res, await directoryPdf(ds, req.actor, params.id, { paper: query.paper, origin: originOf(req, config.PUBLIC_URL) }));
    }),
  );
  router.get(
    '/inspections/:id/report.pdf',
    handle({ params: idParams, query: reportQuery }, async ({ params, query }, req, res) => {
      sendPdf(res, await inspectionReportPdf(ds, store, req.actor, params.id, { temperatureUnit: query.temperature }));
    }),
  );
  return router;
}
