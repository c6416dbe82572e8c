import { Link, useParams } from 'react-router';
import { extractCells, describeCell } from '@shared/editor/document.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import { buttonClass } from '@/components/ui/button.tsx';
import { paths } from '@/config/paths.ts';
import { AttachmentsPanel } from '@/features/attachments/index.ts';
import { EntryPage, type EntryPageSlots } from '@/features/entries/index.ts';
import { ExportMenu } from '@/features/exports/index.ts';
import { AttachFigureButton } from '@/features/figures/index.ts';
import { MeasurementsPanel } from '@/features/measurements/index.ts';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { SignatureBlock, SubmitForReviewButton } from '@/features/reviews/index.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { NotebookGate } from './notebook-gate.tsx';

/** Cells that draw a plot, which can be attached as a figure. */
const PLOT_KINDS = new Set(['branch', 'fold-map', 'trajectory']);

/**
 * /notebooks/:notebookId/entries/:entryId — one entry of a notebook's log. Readers see it
 * read-only. The route composes the entry page with the review, file and export features.
 */
export default function EntryRoute() {
  const { notebookId = '', entryId = '' } = useParams();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data ? `Entry · ${notebook.data.title}` : 'Entry');
  return (
    <NotebookGate notebookId={notebookId} loadingLabel="Loading the entry">
      {(nb) => {
        const canWrite = nb.role !== 'reader';
        const slots: EntryPageSlots = {
          headerActions: ({ entry, head, unrecorded }) => (
            <>
              <ExportMenu
                notebookId={notebookId}
                entryId={entryId}
                revisionId={head.id}
                cells={extractCells(head.document)
                  .filter((c) => isAnalysisKind(c.kind))
                  .map((c) => ({ id: c.id, label: describeCell(c) }))}
              />
              {entry.status !== 'draft' && (
                <Link to={paths.entryReview.getHref(notebookId, entryId)} className={buttonClass('secondary', 'sm')}>
                  Review
                </Link>
              )}
              {canWrite && (entry.status === 'draft' || entry.status === 'changes-requested') && (
                <SubmitForReviewButton
                  notebookId={notebookId}
                  entryId={entryId}
                  revisionId={head.id}
                  disabled={unrecorded || head.number < 2}
                  label={entry.status === 'changes-requested' ? 'Submit again' : undefined}
                />
              )}
            </>
          ),
          beforeDocument: ({ head }) =>
            (head.signatures ?? []).length > 0 ? (
              <div className="mb-4 space-y-2">
                {head.signatures.map((s) => (
                  <SignatureBlock key={s.id} signature={s} />
                ))}
              </div>
            ) : null,
          afterDocument: ({ insertImage }) => (
            <div className="mt-8 grid gap-6 lg:grid-cols-2">
              <AttachmentsPanel
                notebookId={notebookId}
                entryId={entryId}
                canWrite={canWrite}
                onPlaceImage={insertImage}
              />
              <MeasurementsPanel notebookId={notebookId} entryId={entryId} canWrite={canWrite} />
            </div>
          ),
          cellExtras: (cell, { head, unrecorded }) =>
            canWrite && PLOT_KINDS.has(cell.kind) && extractCells(head.document).some((c) => c.id === cell.id) ? (
              <AttachFigureButton
                notebookId={notebookId}
                entryId={entryId}
                revisionId={head.id}
                cellId={cell.id}
                disabled={unrecorded}
              />
            ) : null,
        };
        return (
          <div>
            <nav aria-label="Breadcrumb" className="mb-3 text-sm">
              <Link to={paths.notebook.getHref(notebookId)}>{nb.title}</Link>
              <span className="mx-2 text-ink-muted">/</span>
              <span className="text-ink-muted">Entry</span>
            </nav>
            <EntryPage notebookId={notebookId} entryId={entryId} canWrite={canWrite} slots={slots} />
          </div>
        );
      }}
    </NotebookGate>
  );
}
