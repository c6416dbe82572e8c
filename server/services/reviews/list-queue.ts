import { In, Not } from 'typeorm';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import type { ReviewView } from '@server/presenters/review.presenter.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { notebookPis } from './review-access.ts';

export interface QueueRow {
  view: ReviewView;
  entryTitle: string;
  notebookTitle: string;
}

/** Open reviews in the notebooks where the actor is PI, oldest first, leaving out entries they wrote or submitted. */
export async function listReviewQueue(ctx: ActingContext): Promise<QueueRow[]> {
  const memberships = await ctx.manager.find(MembershipEntity, { where: { userId: ctx.actor.id, role: 'pi' } });
  const notebookIds = memberships.map((m) => m.notebookId);
  if (notebookIds.length === 0) return [];
  const reviews = await ctx.manager.find(ReviewEntity, {
    where: { notebookId: In(notebookIds), status: 'open', requestedById: Not(ctx.actor.id) },
    relations: { requestedBy: true, decidedBy: true },
    order: { createdAt: 'ASC' },
  });
  const entries = new Map(
    (await ctx.manager.find(EntryEntity, { where: { id: In(reviews.map((r) => r.entryId)) } })).map((e) => [e.id, e]),
  );
  const notebooks = new Map((await ctx.manager.find(NotebookEntity, { where: { id: In(notebookIds) } })).map((n) => [n.id, n]));
  const pisByNotebook = new Map<string, Awaited<ReturnType<typeof notebookPis>>>();
  const rows: QueueRow[] = [];
  for (const review of reviews) {
    const entry = entries.get(review.entryId);
    if (!entry || entry.authorId === ctx.actor.id) continue;
    if (!pisByNotebook.has(review.notebookId)) pisByNotebook.set(review.notebookId, await notebookPis(ctx.manager, review.notebookId));
    rows.push({
      view: { review, pis: pisByNotebook.get(review.notebookId) ?? [] },
      entryTitle: entry.title,
      notebookTitle: notebooks.get(review.notebookId)?.title ?? '',
    });
  }
  return rows;
}
