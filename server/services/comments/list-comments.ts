import { In } from 'typeorm';
import { CommentEntity } from '@server/entities/comment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import type { CommentWithPeople } from '@server/presenters/comment.presenter.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

export interface CommentsWithPeople {
  comments: CommentWithPeople[];
  people: Map<string, { id: string; name: string }>;
}

/** The entry's comments in time order (optionally only those on one revision), with everyone they name. */
export async function listComments(ctx: ActingContext, props: { entry: EntryEntity; revisionId?: string }): Promise<CommentsWithPeople> {
  const comments = await ctx.manager.find(CommentEntity, {
    where: { entryId: props.entry.id, ...(props.revisionId ? { revisionId: props.revisionId } : {}) },
    relations: { author: true, resolvedBy: true },
    order: { createdAt: 'ASC' },
  });
  // Replies to a thread on another revision still belong with their thread.
  const threadIds = new Set(comments.filter((c) => !c.parentId).map((c) => c.id));
  const replies = props.revisionId && threadIds.size
    ? await ctx.manager.find(CommentEntity, { where: { parentId: In([...threadIds]) }, relations: { author: true, resolvedBy: true } })
    : [];
  const all = [...comments, ...replies.filter((r) => !comments.some((c) => c.id === r.id))]
    .filter((c) => !c.parentId || threadIds.has(c.parentId) || !props.revisionId)
    .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
  const ids = [...new Set(all.flatMap((c) => c.mentionIds))];
  const people = new Map((ids.length ? await ctx.manager.find(UserEntity, { where: { id: In(ids) } }) : []).map((u) => [u.id, { id: u.id, name: u.name }]));
  return { comments: all, people };
}
