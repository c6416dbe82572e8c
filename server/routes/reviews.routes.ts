import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import { approveReviewSchema, markSeenSchema, requestChangesSchema, submitReviewSchema } from '@shared/api/reviews.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { NotFoundError, RateLimitedError } from '@server/errors/index.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentQueueItem, presentReviewDetail } from '@server/presenters/review.presenter.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { approveReview, previewReproducibility } from '@server/services/reviews/approve-review.ts';
import { listReviewQueue } from '@server/services/reviews/list-queue.ts';
import { markSeen } from '@server/services/reviews/mark-seen.ts';
import { requestChanges } from '@server/services/reviews/request-changes.ts';
import { authorizeOnEntry, latestReview, reviewView, signaturesOf } from '@server/services/reviews/review-access.ts';
import type { ReviewEntity } from '@server/entities/review.entity.ts';
import { submitReview } from '@server/services/reviews/submit-review.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string };

/** Wrong signing passwords allowed per person in 15 minutes before approval is refused for a while (429). */
export const SIGNATURE_FAILURES_PER_WINDOW = 10;
const params = (req: Request) => req.params as Params;

/**
 * An entry's review: submit, read, mark seen, request changes, approve (sign), and the rerun
 * check. Mounted at /api/notebooks/:notebookId/entries/:entryId/review (see shared/api/reviews.ts).
 */
export function reviewsRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource } = deps;
  const reruns = { queue: deps.runQueue };
  const publicUrl = deps.env.PUBLIC_URL;
  router.use(requireUser);

  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });
  const writing = <T>(req: Request, work: (ctx: ActingContext) => Promise<T>): Promise<T> =>
    dataSource.transaction((manager) => work({ actor: currentUser(req), manager, ip: req.ip }));

  /** The review as the caller sees it, read after the change committed. */
  async function detail(req: Request, review: ReviewEntity) {
    const ctx = reading(req);
    const fresh = await latestReview(ctx.manager, review.entryId);
    if (!fresh) throw new Error('The review could not be read back');
    return presentReviewDetail(await reviewView(ctx.manager, fresh), await signaturesOf(ctx.manager, fresh.revisionId), ctx.actor.id);
  }

  router.post('/', async (req, res) => {
    const body = validate(submitReviewSchema, req.body);
    const review = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'read', lock: true });
      return submitReview(ctx, { entry, revisionId: body.revisionId, note: body.note, publicUrl });
    });
    res.status(201).json(await detail(req, review));
  });

  router.get('/', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const review = await latestReview(ctx.manager, entry.id);
    await authorizeOnEntry(ctx, entry, 'read', review);
    if (!review) throw new NotFoundError('This entry has not been submitted for review');
    res.json(await detail(req, review));
  });

  router.post('/mark-seen', async (req, res) => {
    const body = validate(markSeenSchema, req.body);
    const review = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'read', lock: true });
      return markSeen(ctx, { entry, revisionId: body.revisionId });
    });
    res.json(await detail(req, review));
  });

  router.post('/request-changes', async (req, res) => {
    const body = validate(requestChangesSchema, req.body);
    const review = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'read', lock: true });
      return requestChanges(ctx, { entry, revisionId: body.revisionId, comment: body.comment, publicUrl });
    });
    res.json(await detail(req, review));
  });

  // Counts only wrong passwords (401), per signed-in person, so the password cannot be guessed through signing.
  const signatureFailures = rateLimit({
    windowMs: 15 * 60_000,
    limit: SIGNATURE_FAILURES_PER_WINDOW,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `signature|${currentUser(req).id}`,
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    skipSuccessfulRequests: true,
    handler: (_req, _res, next) => next(new RateLimitedError()),
  });

  router.post('/approve', signatureFailures, async (req, res) => {
    const body = validate(approveReviewSchema, req.body);
    const { review } = await approveReview(
      { dataSource, reruns, publicUrl },
      { actor: currentUser(req), ...params(req), ...body },
    );
    res.json(await detail(req, review));
  });

  router.get('/reproducibility', async (req, res) => {
    res.json(await previewReproducibility({ dataSource, reruns }, { actor: currentUser(req), ...params(req) }));
  });

  return router;
}

/** The caller's review queue. Mounted at /api/reviews. */
export function reviewQueueRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/queue', async (req, res) => {
    const actor = currentUser(req);
    const rows = await listReviewQueue({ actor, manager: deps.dataSource.manager });
    res.json({ items: rows.map((r) => presentQueueItem(r.view, { entry: r.entryTitle, notebook: r.notebookTitle }, actor.id)) });
  });
  return router;
}
