import { createHash, randomUUID } from 'node:crypto';
import { In, type DataSource } from 'typeorm';
import type { AttachFigureInput } from '@shared/api/figures.ts';
import { extractCells } from '@shared/editor/document.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { FigureEntity } from '@server/entities/figure.entity.ts';
import { MeasurementSetEntity } from '@server/entities/measurement-set.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import { StorageUnavailableError } from '@server/services/attachments/upload-errors.ts';
import { figureKey } from '@server/services/attachments/storage-keys.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { isUuid } from '@server/services/ids.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { buildFigureSpec } from './build-figure-spec.ts';
import { renderFigure } from './render-figure.ts';

const sha256 = (data: string | Buffer) => createHash('sha256').update(data).digest('hex');

/**
 * Renders the plot of a cell output in a recorded revision to SVG and PNG, stores both, and
 * records the figure (linked to the revision, the cell and the output's input hash) with its
 * "figure.attached" event in one transaction. Objects are deleted again if that fails.
 */
export async function attachFigure(
  deps: { dataSource: DataSource; storage: FileStorage },
  props: { actor: UserEntity; entry: EntryEntity; input: Required<Pick<AttachFigureInput, 'revisionId' | 'cellId'>> & { caption: string; variable?: string; measurementSetIds: string[] } },
): Promise<FigureEntity> {
  const { entry, input, actor } = props;
  const { dataSource, storage } = deps;
  const revision = await dataSource.manager.findOne(RevisionEntity, { where: { id: input.revisionId, entryId: entry.id } });
  if (!revision) throw new NotFoundError('No such revision of this entry');
  const cell = extractCells(revision.document).find((c) => c.id === input.cellId);
  if (!cell) throw new NotFoundError('No such cell in this revision');
  const output = revision.outputs[cell.id];
  const sets = input.measurementSetIds.length
    ? await dataSource.manager.find(MeasurementSetEntity, { where: { id: In(input.measurementSetIds.filter(isUuid)), entryId: entry.id } })
    : [];
  if (sets.length !== new Set(input.measurementSetIds).size) throw new NotFoundError('No such data set on this entry');
  const { kind, spec } = buildFigureSpec(cell, output, {
    caption: input.caption,
    variable: input.variable,
    measurements: sets.map((s) => ({ name: s.name, rows: s.rows })),
  });
  const rendered = await renderFigure(spec);
  const id = randomUUID();
  const svgKey = figureKey(entry.notebookId, entry.id, id, 'svg');
  const pngKey = figureKey(entry.notebookId, entry.id, id, 'png');
  const cleanUp = () => Promise.all([svgKey, pngKey].map((k) => storage.delete(k).catch(() => undefined)));
  try {
    await storage.put(svgKey, rendered.svg, 'image/svg+xml');
    await storage.put(pngKey, rendered.png, 'image/png');
  } catch (error) {
    console.error(`[figures] storing ${id} failed: ${(error as Error).message}`);
    await cleanUp();
    throw new StorageUnavailableError('File storage is not reachable right now, so the figure was not saved. Try again in a moment.');
  }
  try {
    return await dataSource.transaction(async (manager) => {
      const row = manager.create(FigureEntity, {
        id,
        notebookId: entry.notebookId,
        entryId: entry.id,
        revisionId: revision.id,
        cellId: cell.id,
        cellKind: kind,
        inputHash: output!.inputHash,
        engineVersion: output!.engineVersion,
        caption: input.caption,
        spec,
        svgKey,
        pngKey,
        svgSha256: sha256(rendered.svg),
        pngSha256: sha256(rendered.png),
        pngWidth: rendered.width,
        pngHeight: rendered.height,
        createdById: actor.id,
      });
      await manager.insert(FigureEntity, row);
      await recordEvent(manager, {
        actorId: actor.id,
        action: 'figure.attached',
        entityType: 'figure',
        entityId: id,
        notebookId: entry.notebookId,
        summary: { entryId: entry.id, revisionId: revision.id, revisionContentHash: revision.contentHash, cellId: cell.id, inputHash: output!.inputHash, svgSha256: row.svgSha256, pngSha256: row.pngSha256 },
      });
      return manager.findOneOrFail(FigureEntity, { where: { id }, relations: { createdBy: true } });
    });
  } catch (error) {
    await cleanUp();
    throw error;
  }
}

export function listFigures(manager: DataSource['manager'], entry: EntryEntity): Promise<FigureEntity[]> {
  return manager.find(FigureEntity, { where: { entryId: entry.id }, relations: { createdBy: true }, order: { createdAt: 'DESC' } });
}

export async function loadFigure(manager: DataSource['manager'], entry: EntryEntity, figureId: string): Promise<FigureEntity> {
  if (!isUuid(figureId)) throw new NotFoundError('No such figure');
  const row = await manager.findOne(FigureEntity, { where: { id: figureId, entryId: entry.id }, relations: { createdBy: true } });
  if (!row) throw new NotFoundError('No such figure');
  return row;
}
