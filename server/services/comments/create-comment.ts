import { In } from 'typeorm';
import type { CreateCommentInput } from '@shared/api/reviews.ts';
import { extractCells, type DocNode } from '@shared/editor/document.ts';
import { CommentEntity } from '@server/entities/comment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { notify } from '@server/services/mail-outbox/enqueue-mail.ts';
import { commentMail, entryLink } from '@server/services/mail-outbox/review-mails.ts';
import { authorizeOnEntry, latestReview } from '@server/services/reviews/review-access.ts';
import { findMentions } from './mentions.ts';

type Props = { entry: EntryEntity; publicUrl: string } & Required<Pick<CreateCommentInput, 'anchor' | 'body'>> & { parentId?: string };

/**
 * A comment on an entry, by any member. The anchor must name a revision of this entry, and the
 * block (by index among the document's top-level blocks) or cell (by id) must exist in it. A reply
 * joins its parent's thread (threads are one level deep). Mentioned members get a "mention" mail;
 * the thread's author gets a "comment-reply" mail — each unless they turned it off, never to oneself.
 */
export async function createComment(ctx: ActingContext, props: Props): Promise<CommentEntity> {
  const { entry, anchor } = props;
  await authorizeOnEntry(ctx, entry, 'comment', await latestReview(ctx.manager, entry.id));
  const revision = await ctx.manager.findOne(RevisionEntity, { where: { id: anchor.revisionId, entryId: entry.id } });
  if (!revision) throw new ValidationError('The comment must point at a revision of this entry', [{ path: 'anchor.revisionId', message: 'Not a revision of this entry' }]);
  const blocks = (revision.document as { content?: DocNode[] }).content ?? [];
  if (anchor.blockIndex !== undefined && anchor.blockIndex >= blocks.length) {
    throw new ValidationError('No such block in that revision', [
      { path: 'anchor.blockIndex', message: `The revision has ${blocks.length} blocks (0 to ${blocks.length - 1})` },
    ]);
  }
  if (anchor.cellId !== undefined && !extractCells(revision.document).some((c) => c.id === anchor.cellId)) {
    throw new ValidationError('No such cell in that revision', [{ path: 'anchor.cellId', message: 'No cell with this id in the revision' }]);
  }

  let thread: CommentEntity | null = null;
  if (props.parentId) {
    const parent = await ctx.manager.findOne(CommentEntity, { where: { id: props.parentId, entryId: entry.id } });
    if (!parent) throw new ValidationError('No such comment to reply to', [{ path: 'parentId', message: 'Not a comment on this entry' }]);
    thread = parent.parentId ? await ctx.manager.findOneByOrFail(CommentEntity, { id: parent.parentId }) : parent;
  }

  const members = await ctx.manager.find(MembershipEntity, { where: { notebookId: entry.notebookId }, relations: { user: true } });
  const mentioned = findMentions(
    props.body,
    members.map((m) => m.user).filter((u) => u.active),
  );
  const comment = await ctx.manager.save(
    ctx.manager.create(CommentEntity, {
      entryId: entry.id,
      notebookId: entry.notebookId,
      parentId: thread?.id ?? null,
      revisionId: anchor.revisionId,
      blockIndex: anchor.blockIndex ?? null,
      cellId: anchor.cellId ?? null,
      kind: 'comment',
      body: props.body,
      authorId: ctx.actor.id,
      mentionIds: mentioned.map((u) => u.id),
      resolvedAt: null,
      resolvedById: null,
    }),
  );
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'comment.created',
    entityType: 'comment',
    entityId: comment.id,
    notebookId: entry.notebookId,
    summary: {
      entryId: entry.id,
      revisionId: anchor.revisionId,
      ...(anchor.blockIndex !== undefined ? { blockIndex: anchor.blockIndex } : {}),
      ...(anchor.cellId !== undefined ? { cellId: anchor.cellId } : {}),
      threadId: thread?.id ?? null,
      mentions: mentioned.map((u) => u.id),
    },
  });

  const link = entryLink(props.publicUrl, entry.notebookId, entry.id);
  const mail = (recipient: UserEntity, reason: 'reply' | 'mention') =>
    notify(ctx.manager, {
      recipient,
      kind: reason === 'mention' ? 'mention' : 'comment-reply',
      message: {
        to: recipient.email,
        ...commentMail({ recipientName: recipient.name, authorName: ctx.actor.name, entryTitle: entry.title, body: props.body, reason, link }),
      },
    });
  for (const person of mentioned) if (person.id !== ctx.actor.id) await mail(person, 'mention');
  if (thread && thread.authorId !== ctx.actor.id && !mentioned.some((u) => u.id === thread.authorId)) {
    const [threadAuthor] = await ctx.manager.find(UserEntity, { where: { id: In([thread.authorId]), active: true } });
    if (threadAuthor) await mail(threadAuthor, 'reply');
  }
  return comment;
}
