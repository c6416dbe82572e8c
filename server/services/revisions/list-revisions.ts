import { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import type { RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { isUuid } from '@server/services/ids.ts';

/** Every revision of an entry, newest first (documents and outputs are not loaded). */
export async function listRevisions(ctx: ActingContext, entry: EntryEntity): Promise<RevisionWithAuthor[]> {
  return ctx.manager.find(RevisionEntity, {
    where: { entryId: entry.id },
    relations: { author: true, signatures: { signer: true } },
    select: {
      id: true,
      entryId: true,
      number: true,
      parentId: true,
      restoredFromId: true,
      title: true,
      message: true,
      authorId: true,
      contentHash: true,
      createdAt: true,
      author: { id: true, name: true },
      signatures: { id: true, revisionId: true, contentHash: true, printedName: true, meaning: true, signedAt: true, reproducibility: true, signer: { id: true, name: true } },
    },
    order: { number: 'DESC' },
  });
}

/** One revision of the entry, whole. */
export async function getRevision(ctx: ActingContext, entry: EntryEntity, revisionId: string): Promise<RevisionWithAuthor> {
  if (!isUuid(revisionId)) throw new NotFoundError('No such revision of this entry');
  const revision = await ctx.manager.findOne(RevisionEntity, { where: { id: revisionId, entryId: entry.id }, relations: { author: true, signatures: { signer: true } } });
  if (!revision) throw new NotFoundError('No such revision of this entry');
  return revision;
}
