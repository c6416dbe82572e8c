import type { Figure } from '@shared/api/figures.ts';
import type { FigureEntity } from '@server/entities/figure.entity.ts';

export function presentFigure(f: FigureEntity): Figure {
  const base = `/api/notebooks/${f.notebookId}/entries/${f.entryId}/figures/${f.id}`;
  return {
    id: f.id,
    entryId: f.entryId,
    revisionId: f.revisionId,
    cellId: f.cellId,
    cellKind: f.cellKind as Figure['cellKind'],
    inputHash: f.inputHash,
    engineVersion: f.engineVersion,
    caption: f.caption,
    svgSha256: f.svgSha256,
    pngSha256: f.pngSha256,
    pngWidth: f.pngWidth,
    pngHeight: f.pngHeight,
    createdBy: { id: f.createdBy.id, name: f.createdBy.name },
    createdAt: f.createdAt.toISOString(),
    svgUrl: `${base}/svg`,
    pngUrl: `${base}/png`,
  };
}
