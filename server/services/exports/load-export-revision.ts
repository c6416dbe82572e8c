import { extractCells, type DocumentCell } from '@shared/editor/document.ts';
import type { ExportSource } from '@shared/api/exports.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { NotPlottableError } from '@server/services/figures/figure-errors.ts';
import { okResult } from './result-csv.ts';

/** The revision to export: the one named, or the entry's head. */
export async function loadExportRevision(ctx: ActingContext, entry: EntryEntity, revisionId?: string): Promise<RevisionEntity> {
  const id = revisionId ?? entry.headRevisionId;
  const revision = id ? await ctx.manager.findOne(RevisionEntity, { where: { id, entryId: entry.id }, relations: { author: true } }) : null;
  if (!revision) throw new NotFoundError('No such revision of this entry');
  return revision;
}

/** A cell of the revision with its result and where it came from; 404 for an unknown cell, 422 for one without a result. */
export function cellResultOf(entry: EntryEntity, revision: RevisionEntity, cellId: string) {
  const cell: DocumentCell | undefined = extractCells(revision.document).find((c) => c.id === cellId);
  if (!cell) throw new NotFoundError('No such cell in this revision');
  const output = revision.outputs[cellId];
  const result = okResult(output);
  if (!output || !result) throw new NotPlottableError('This cell has no result in this revision to export');
  const source: ExportSource = {
    entryId: entry.id,
    revisionId: revision.id,
    revisionNumber: revision.number,
    contentHash: revision.contentHash,
    cellId,
    cellKind: cell.kind,
    inputHash: output.inputHash,
    engineVersion: output.engineVersion,
    computedAt: output.computedAt,
  };
  const task = (cell.input as { task?: { parameter?: string; parameters?: [string, string] } }).task ?? {};
  return { cell, output, result, source, names: { parameter: task.parameter, parameters: task.parameters } };
}
