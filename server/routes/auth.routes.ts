import { Router } from 'express';
import { completeResetSchema, requestResetSchema, signInSchema } from '@shared/api/auth.ts';
import { LIMITS } from '@shared/domain/limits.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { UnauthenticatedError } from '@server/errors/index.ts';
import { sendAfterCommit } from '@server/mail/mailer.ts';
import { resetMail } from '@server/mail/templates.ts';
import { authenticateLocal, currentUser, logIn, logOut, requireUser } from '@server/middlewares/authenticate.ts';
import { presentMe } from '@server/presenters/me.presenter.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { completePasswordReset } from '@server/services/auth/complete-password-reset.ts';
import { requestPasswordReset } from '@server/services/auth/request-password-reset.ts';
import { inTransaction, validate } from './pipeline.ts';

export async function meOf(deps: RouteDeps, user: UserEntity) {
  const memberships = await deps.dataSource.manager.find(MembershipEntity, { where: { userId: user.id } });
  return presentMe(user, memberships);
}

/** Sign-in, sign-out, the CSRF token, "who am I" and password reset by e-mail. */
export function authRoutes(deps: RouteDeps): Router {
  const router = Router();
  const { dataSource } = deps;

  router.get('/csrf', (req, res) => {
    res.json({ csrfToken: deps.generateCsrfToken(req) });
  });

  router.get('/me', requireUser, async (req, res) => {
    res.json(await meOf(deps, currentUser(req)));
  });

  router.post('/sign-in', deps.rateLimits.signIn, async (req, res) => {
    const input = validate(signInSchema, req.body);
    req.body = input;
    const user = await authenticateLocal(deps.passport, req, res);
    if (!user) {
      await inTransaction(dataSource, req, (ctx) =>
        recordEvent(ctx.manager, { actorId: null, action: 'auth.sign_in_failed', entityType: 'user', summary: { email: input.email, ip: req.ip ?? null } }),
      );
      throw new UnauthenticatedError('The e-mail address or password is not right', [
        { path: 'password', message: 'The e-mail address or password is not right' },
      ]);
    }
    await logIn(req, user);
    await inTransaction(dataSource, req, (ctx) =>
      recordEvent(ctx.manager, { actorId: user.id, action: 'auth.signed_in', entityType: 'user', entityId: user.id, summary: { ip: req.ip ?? null } }),
    );
    res.json(await meOf(deps, user));
  });

  router.post('/sign-out', async (req, res) => {
    const user = req.user;
    if (user) {
      await logOut(req);
      await inTransaction(dataSource, req, (ctx) =>
        recordEvent(ctx.manager, { actorId: user.id, action: 'auth.signed_out', entityType: 'user', entityId: user.id }),
      );
    }
    res.status(204).end();
  });

  router.post('/password-reset', deps.rateLimits.passwordReset, async (req, res) => {
    const input = validate(requestResetSchema, req.body);
    const created = await inTransaction(dataSource, req, (ctx) => requestPasswordReset(ctx, input));
    if (created) {
      const link = `${deps.env.PUBLIC_URL}/reset-password/${created.token}`;
      await sendAfterCommit(deps.mailer, resetMail({ to: created.user.email, name: created.user.name, link, expiresHours: LIMITS.resetTtlHours }));
    }
    // The same answer whether or not the address is known.
    res.status(202).json({ message: 'If an account has this address, a reset link is on its way.' });
  });

  router.post('/password-reset/complete', deps.rateLimits.passwordReset, async (req, res) => {
    const input = validate(completeResetSchema, req.body);
    await inTransaction(dataSource, req, (ctx) => completePasswordReset(ctx, input));
    res.status(204).end();
  });

  return router;
}
