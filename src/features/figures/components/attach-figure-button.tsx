import { Button } from '@/components/ui/button.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { useAttachFigure } from '../api/attach-figure.ts';

/**
 * One action that keeps a cell's plot as a figure of the recorded revision (rendered by the
 * server). Belongs in the toolbar of branch, fold-map and trajectory cells; needs the revision
 * the output was recorded in (the head, when the working copy has no unsaved change to the cell).
 */
export function AttachFigureButton(props: {
  notebookId: string;
  entryId: string;
  revisionId: string;
  cellId: string;
  caption?: string;
  variable?: string;
  measurementSetIds?: string[];
  disabled?: boolean;
}) {
  const attach = useAttachFigure(props.notebookId, props.entryId);
  return (
    <span className="inline-flex flex-col items-start gap-1">
      <Button
        variant="secondary"
        size="sm"
        busy={attach.isPending}
        disabled={props.disabled}
        onClick={() =>
          attach.mutate({
            revisionId: props.revisionId,
            cellId: props.cellId,
            caption: props.caption ?? '',
            variable: props.variable,
            measurementSetIds: props.measurementSetIds ?? [],
          })
        }
      >
        Attach as figure
      </Button>
      {attach.isSuccess && (
        <span role="status" className="text-xs text-ink-muted">
          Figure attached —{' '}
          <a className="text-accent underline" href={attach.data.pngUrl} target="_blank" rel="noreferrer">
            PNG
          </a>{' '}
          ·{' '}
          <a className="text-accent underline" href={attach.data.svgUrl} target="_blank" rel="noreferrer">
            SVG
          </a>
        </span>
      )}
      {attach.isError && (
        <span role="alert" className="text-xs text-unstable">
          {isApiError(attach.error) ? attach.error.message : 'The figure could not be made'}
        </span>
      )}
    </span>
  );
}
