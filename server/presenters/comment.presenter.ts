import type { Comment, CommentThread } from '@shared/api/reviews.ts';
import type { CommentEntity } from '@server/entities/comment.entity.ts';

type Person = { id: string; name: string };

/** A comment with its author and resolver loaded; `people` resolves mention ids to names. */
export type CommentWithPeople = CommentEntity & { author: Person; resolvedBy: Person | null };

export function presentComment(c: CommentWithPeople, people: ReadonlyMap<string, Person>): Comment {
  return {
    id: c.id,
    entryId: c.entryId,
    parentId: c.parentId,
    anchor: {
      revisionId: c.revisionId,
      ...(c.blockIndex !== null ? { blockIndex: c.blockIndex } : {}),
      ...(c.cellId !== null ? { cellId: c.cellId } : {}),
    },
    kind: c.kind,
    body: c.body,
    author: { id: c.author.id, name: c.author.name },
    mentions: c.mentionIds.flatMap((id) => {
      const p = people.get(id);
      return p ? [{ id: p.id, name: p.name }] : [];
    }),
    createdAt: c.createdAt.toISOString(),
    resolvedAt: c.resolvedAt ? c.resolvedAt.toISOString() : null,
    resolvedBy: c.resolvedBy ? { id: c.resolvedBy.id, name: c.resolvedBy.name } : null,
  };
}

/** Top-level comments in time order, each with its replies in time order. */
export function presentThreads(comments: CommentWithPeople[], people: ReadonlyMap<string, Person>): CommentThread[] {
  const replies = new Map<string, Comment[]>();
  for (const c of comments) {
    if (c.parentId) replies.set(c.parentId, [...(replies.get(c.parentId) ?? []), presentComment(c, people)]);
  }
  return comments.filter((c) => !c.parentId).map((c) => ({ ...presentComment(c, people), replies: replies.get(c.id) ?? [] }));
}
