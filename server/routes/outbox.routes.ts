import { Router } from 'express';
import type { RouteDeps } from '@server/app-deps.ts';
import { NotFoundError } from '@server/errors/index.ts';
import { listOutbox, readOutboxMessage } from '@server/mail/outbox-reader.ts';

/**
 * The local outbox: every message the SMTP sink kept. Development and demo only: the app
 * does not mount this router when NODE_ENV is production. Open to all, so an invitee can
 * read their invitation in the local demo.
 */
export function outboxRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    res.json({ messages: await listOutbox(deps.env.OUTBOX_DIR) });
  });
  router.get('/:id', async (req, res) => {
    const message = await readOutboxMessage(deps.env.OUTBOX_DIR, req.params.id);
    if (!message) throw new NotFoundError('No such message in the outbox');
    res.json(message);
  });
  return router;
}
