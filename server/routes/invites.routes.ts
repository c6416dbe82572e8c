import { Router } from 'express';
import { acceptInviteSchema, createInviteSchema } from '@shared/api/auth.ts';
import { LIMITS } from '@shared/domain/limits.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { sendAfterCommit } from '@server/mail/mailer.ts';
import { inviteMail } from '@server/mail/templates.ts';
import { logIn, requireUser } from '@server/middlewares/authenticate.ts';
import { authorizeSite } from '@server/policies/site.policy.ts';
import { presentInvite } from '@server/presenters/invite.presenter.ts';
import { acceptInvite } from '@server/services/invites/accept-invite.ts';
import { createInvite } from '@server/services/invites/create-invite.ts';
import { findOpenInvite } from '@server/services/invites/find-open-invite.ts';
import { listInvites } from '@server/services/invites/list-invites.ts';
import { meOf } from './auth.routes.ts';
import { asUser, inTransaction, validate } from './pipeline.ts';

/** Administrators invite people by e-mail; the link lets the invitee set a password. */
export function invitesRoutes(deps: RouteDeps): Router {
  const router = Router();
  const { dataSource } = deps;

  router.get('/', requireUser, async (req, res) => {
    authorizeSite(req.user, 'administer');
    const invites = await listInvites(dataSource.manager);
    res.json({ invites: invites.map(presentInvite) });
  });

  router.post('/', requireUser, deps.rateLimits.invites, async (req, res) => {
    authorizeSite(req.user, 'administer');
    const input = validate(createInviteSchema, req.body);
    const { invite, token } = await asUser(dataSource, req, (ctx) => createInvite(ctx, input));
    const link = `${deps.env.PUBLIC_URL}/invite/${token}`;
    const mailSent = await sendAfterCommit(
      deps.mailer,
      inviteMail({ to: invite.email, name: invite.name, inviterName: invite.invitedBy.name, link, expiresHours: LIMITS.inviteTtlHours }),
    );
    res.status(201).json({ ...presentInvite(invite), mailSent });
  });

  router.get('/:token', deps.rateLimits.invites, async (req, res) => {
    const invite = await findOpenInvite(dataSource.manager, String(req.params.token));
    res.json({ email: invite.email, name: invite.name, expiresAt: invite.expiresAt.toISOString() });
  });

  router.post('/:token/accept', deps.rateLimits.invites, async (req, res) => {
    const input = validate(acceptInviteSchema, req.body);
    const user = await inTransaction(dataSource, req, (ctx) => acceptInvite(ctx, { token: String(req.params.token), ...input }));
    await logIn(req, user);
    res.status(201).json(await meOf(deps, user));
  });

  return router;
}
