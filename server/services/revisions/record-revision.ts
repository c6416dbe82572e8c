import type { CellOutputs } from '@shared/cells/output.ts';
import { CELL_KIND_LABELS } from '@shared/cells/kinds.ts';
import { documentToPlainText, extractCells, type DocumentCell, type DocumentJson } from '@shared/editor/document.ts';
import { EntryDraftEntity } from '@server/entities/entry-draft.entity.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { followNewRevision } from '@server/services/reviews/follow-revision.ts';
import { revisionContentHash } from './content-hash.ts';
import { pruneOutputs } from './prune-outputs.ts';
import { RevisionConflictError } from './revision-conflict.error.ts';
import { verifyOutputs } from './verify-outputs.ts';

export interface RecordRevisionProps {
  /** The entry, already loaded, authorized and locked (loadEntry with lock: true) in ctx.manager's transaction. */
  entry: EntryEntity;
  /** The revision the edit started from; must be the head. Null only for an entry's first revision. */
  baseRevisionId: string | null;
  title: string;
  entryDate: string;
  tags: string[];
  document: DocumentJson;
  outputs: CellOutputs;
  message?: string | null;
  /** When this revision restores an older one. */
  restoredFromId?: string | null;
  /** Delete the actor's working draft (default true: the draft is what was just recorded). */
  consumeDraft?: boolean;
  /** The outputs come from an earlier revision, checked when it was recorded. */
  outputsVerified?: boolean;
}

/**
 * The text the search box looks in (and its snippets show): title, tags, the prose of the
 * document, and each cell in words — its kind, its name, a model's equations and parameter
 * names, an analysis's varied parameters — never the cell's settings as JSON.
 */
export function searchTextOf(props: { title: string; tags: string[]; document: DocumentJson }): string {
  const prose: DocumentJson = {
    ...props.document,
    content: (props.document.content ?? []).filter((node) => node.type !== 'cell'),
  };
  const cells = extractCells(props.document).map(cellInWords);
  return [props.title, props.tags.join(' '), documentToPlainText(prose), ...cells].join('\n');
}

function cellInWords(cell: DocumentCell): string {
  const words: string[] = [CELL_KIND_LABELS[cell.kind]];
  const input = cell.input;
  if (typeof input.name === 'string') words.push(input.name);
  const named = (list: unknown, text: (item: Record<string, unknown>) => string) =>
    Array.isArray(list) ? list.filter((i): i is Record<string, unknown> => !!i && typeof i === 'object').map(text) : [];
  words.push(...named(input.variables, (v) => `${String(v.name ?? '')}' = ${String(v.rhs ?? '')}`));
  words.push(...named(input.definitions, (d) => `${String(d.name ?? '')} = ${String(d.expression ?? '')}`));
  words.push(...named(input.parameters, (p) => [p.name, p.note].filter((x) => typeof x === 'string' && x).join(' ')));
  const task = input.task && typeof input.task === 'object' ? (input.task as Record<string, unknown>) : {};
  if (typeof task.parameter === 'string') words.push(`in ${task.parameter}`);
  if (Array.isArray(task.parameters)) words.push(`in ${task.parameters.filter((x) => typeof x === 'string').join(' and ')}`);
  return words.filter(Boolean).join(' · ');
}

/** A revision with its author, for presenting. */
export async function findRevisionWithAuthor(ctx: ActingContext, id: string): Promise<RevisionWithAuthor | null> {
  return ctx.manager.findOne(RevisionEntity, { where: { id }, relations: { author: true, signatures: { signer: true } } });
}

/**
 * Records a new immutable revision of an entry on top of its head.
 *
 * The caller holds the entry row lock, so two saves on the same base cannot both win: the second
 * sees a different head and gets a RevisionConflictError carrying the current head. Outputs of
 * cells no longer in the document are dropped; successful ones must match the server's stored run. The entry's list columns follow the new head; the
 * actor's working draft is consumed (unless told otherwise); an audit event is written in the
 * same transaction.
 */
export async function recordRevision(ctx: ActingContext, props: RecordRevisionProps): Promise<RevisionWithAuthor> {
  const { entry } = props;
  if (entry.headRevisionId !== props.baseRevisionId) {
    const head = entry.headRevisionId ? await findRevisionWithAuthor(ctx, entry.headRevisionId) : null;
    if (!head) throw new Error(`Entry ${entry.id} has no head revision`);
    throw new RevisionConflictError(head);
  }
  const outputs = pruneOutputs(props.document, props.outputs);
  if (!props.outputsVerified) await verifyOutputs(ctx.manager, outputs);
  const content = { title: props.title, entryDate: props.entryDate, tags: props.tags, document: props.document, outputs };
  const number = entry.revisionCount + 1;
  const revision = ctx.manager.create(RevisionEntity, {
    entryId: entry.id,
    number,
    parentId: entry.headRevisionId,
    restoredFromId: props.restoredFromId ?? null,
    ...content,
    message: props.message?.trim() ? props.message.trim() : null,
    authorId: ctx.actor.id,
    contentHash: revisionContentHash(content),
  });
  await ctx.manager.save(revision);

  await ctx.manager.update(EntryEntity, entry.id, {
    title: content.title,
    entryDate: content.entryDate,
    tags: content.tags,
    headRevisionId: revision.id,
    revisionCount: number,
    searchText: searchTextOf(content),
  });
  await followNewRevision(ctx, entry, revision.id);
  if (props.consumeDraft ?? true) await ctx.manager.delete(EntryDraftEntity, { entryId: entry.id, userId: ctx.actor.id });

  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: props.restoredFromId ? 'revision.restored' : 'revision.recorded',
    entityType: 'revision',
    entityId: revision.id,
    notebookId: entry.notebookId,
    summary: {
      entryId: entry.id,
      number,
      parentId: revision.parentId,
      contentHash: revision.contentHash,
      ...(props.restoredFromId ? { restoredFromId: props.restoredFromId } : {}),
    },
  });
  const saved = await findRevisionWithAuthor(ctx, revision.id);
  if (!saved) throw new Error('The recorded revision could not be read back');
  return saved;
}
