/**
 * Users and access (server/services/access.ts): the public one-time-link endpoints (invitation,
 * password reset) and the admin's people endpoints, plus "send report to owner". Mounted before
 * the routers that require a signed-in user for every path.
 */
import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import {
  acceptInvitationRequest,
  FORGOT_PASSWORD_ANSWER,
  forgotPasswordBody,
  inviteBody,
  resetPasswordBody,
  roleChangeBody,
  sendReportBody,
} from '../../shared/access';
import { requireUser } from '../auth/session';
import { handle } from '../http/handle';
import { oneTimeLinkLimiter, resetRequestLimiter, type LimitConfig } from '../http/rate-limits';
import { logger } from '../logger';
import * as access from '../services/access';
import * as invitations from '../services/invitations';
import { Mailer, type MailConfig } from '../services/mail';
import { inspectionReportPdf } from '../services/pdf/report';
import type { PhotoStore } from '../services/photo-store';

const tokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{40,60}$/) });
const orgParams = z.object({ organisationId: z.uuid() });
const personParams = orgParams.extend({ userId: z.uuid() });
const grantParams = personParams.extend({ buildingId: z.uuid() });
const invitationParams = orgParams.extend({ invitationId: z.uuid() });
const inspectionParams = z.object({ id: z.uuid() });

function regenerate(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.regenerate((e) => (e ? reject(e) : resolve())));
}

async function signInAs(req: Request, userId: string): Promise<void> {
  await regenerate(req);
  req.session.userId = userId;
}

/** The PDF is made by server/services/pdf/report.ts, the same as GET /api/inspections/:id/report.pdf. */
const reportPdf: access.ReportPdf = (ds, store, actor, inspectionId) =>
  inspectionReportPdf(ds, store as PhotoStore, actor, inspectionId);

export function accessRouter(ds: DataSource, config: MailConfig & LimitConfig, store: PhotoStore): Router {
  const router = Router();
  const mailer = new Mailer(config);
  const user = requireUser(ds);

  // like sign-in: per address and e-mail (or token), per 15 minutes (server/http/rate-limits.ts)
  const limiter = oneTimeLinkLimiter(config);
  const resetLimiter = resetRequestLimiter(config);

  // ----- public: the one-time links -----
  router.post(
    '/auth/forgot-password',
    resetLimiter,
    limiter,
    handle({ body: forgotPasswordBody }, async ({ body }, _req, res) => {
      // answer first, then look the address up: the same answer and timing either way
      res.status(200).json({ ok: true, message: FORGOT_PASSWORD_ANSWER });
      access.requestPasswordReset(ds, mailer, body.email).catch((error: unknown) => {
        logger.error({ err: error }, 'password reset e-mail failed');
      });
    }),
  );
  router.get(
    '/password-resets/:token',
    limiter,
    handle({ params: tokenParams }, async ({ params }) => access.viewPasswordReset(ds.manager, params.token)),
  );
  router.post(
    '/password-resets/:token',
    limiter,
    handle({ params: tokenParams, body: resetPasswordBody }, async ({ params, body }, req) => {
      const userId = await access.resetPassword(ds, params.token, body.password);
      await signInAs(req, userId);
      return { ok: true, userId };
    }),
  );
  router.get(
    '/invitations/:token',
    limiter,
    handle({ params: tokenParams }, async ({ params }) => invitations.viewInvitation(ds.manager, params.token)),
  );
  router.post(
    '/invitations/:token/accept',
    limiter,
    handle({ params: tokenParams, body: acceptInvitationRequest }, async ({ params, body }, req) => {
      const userId = await invitations.acceptInvitation(ds, params.token, body, req.session.userId);
      await signInAs(req, userId);
      return { ok: true, userId };
    }, 201),
  );

  // ----- admin: the organisation's people -----
  router.get(
    '/organisations/:organisationId/people',
    user,
    handle({ params: orgParams }, async ({ params }, req) => access.listPeople(ds.manager, req.actor, params.organisationId)),
  );
  router.post(
    '/organisations/:organisationId/invitations',
    user,
    handle({ params: orgParams, body: inviteBody }, async ({ params, body }, req) =>
      invitations.invite(ds, mailer, req.actor, params.organisationId, body), 201),
  );
  router.delete(
    '/organisations/:organisationId/invitations/:invitationId',
    user,
    handle({ params: invitationParams }, async ({ params }, req) => {
      await invitations.cancelInvitation(ds.manager, req.actor, params.organisationId, params.invitationId);
      return { ok: true };
    }),
  );
  router.patch(
    '/organisations/:organisationId/people/:userId',
    user,
    handle({ params: personParams, body: roleChangeBody }, async ({ params, body }, req) => {
      await access.changeRole(ds, req.actor, params.organisationId, params.userId, body.role);
      return { ok: true };
    }),
  );
  router.delete(
    '/organisations/:organisationId/people/:userId',
    user,
    handle({ params: personParams }, async ({ params }, req) => {
      await access.removePerson(ds, req.actor, params.organisationId, params.userId);
      return { ok: true };
    }),
  );
  router.post(
    '/organisations/:organisationId/people/:userId/buildings/:buildingId',
    user,
    handle({ params: grantParams }, async ({ params }, req) => {
      await access.grantBuilding(ds.manager, req.actor, params.organisationId, params.userId, params.buildingId);
      return { ok: true };
    }),
  );
  router.delete(
    '/organisations/:organisationId/people/:userId/buildings/:buildingId',
    user,
    handle({ params: grantParams }, async ({ params }, req) => {
      await access.revokeBuilding(ds.manager, req.actor, params.organisationId, params.userId, params.buildingId);
      return { ok: true };
    }),
  );

  // ----- send the inspection report to the building's owners -----
  router.post(
    '/inspections/:id/send-report',
    user,
    handle({ params: inspectionParams, body: sendReportBody }, async ({ params, body }, req) =>
      access.sendReport(ds, mailer, reportPdf, store, req.actor, params.id, body.to)),
  );

  return router;
}
