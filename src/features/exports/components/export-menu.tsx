import { useId, useState } from 'react';
import { buttonClass } from '@/components/ui/button.tsx';
import { exportsApi } from '../api/exports-path.ts';

/**
 * Downloads of an entry: the printable record, the whole entry as a ZIP and, for each cell with
 * a result, its data as CSV or JSON. Belongs in the entry page header, beside the revision picker.
 */
export function ExportMenu(props: { notebookId: string; entryId: string; revisionId?: string; cells?: { id: string; label: string }[] }) {
  const [open, setOpen] = useState(false);
  const menuId = useId();
  const { notebookId, entryId, revisionId } = props;
  const link = 'block rounded px-3 py-1.5 text-sm text-ink hover:bg-sunken';
  return (
    <div
      className="relative inline-block"
      onKeyDown={(e) => {
        if (e.key === 'Escape') setOpen(false);
      }}
    >
      <button type="button" className={buttonClass('secondary', 'sm')} aria-expanded={open} aria-controls={menuId} onClick={() => setOpen((o) => !o)}>
        Export
      </button>
      {open && (
        <div id={menuId} role="group" aria-label="Export" className="absolute right-0 z-20 mt-1 w-72 rounded-md border border-rule bg-surface p-1 shadow-lg">
          <a className={link} href={exportsApi.record(notebookId, entryId, revisionId)} target="_blank" rel="noreferrer">
            Printable record
          </a>
          <a className={link} href={exportsApi.archive(notebookId, entryId, revisionId)} download>
            Whole entry (ZIP)
          </a>
          {(props.cells ?? []).map((c) => (
            <div key={c.id} className="flex items-center justify-between gap-2 px-3 py-1 text-sm">
              <span className="truncate text-ink-muted">{c.label}</span>
              <span className="flex gap-2">
                <a className="text-accent underline" href={exportsApi.cell(notebookId, entryId, c.id, 'csv', revisionId)} download aria-label={`${c.label} as CSV`}>
                  CSV
                </a>
                <a className="text-accent underline" href={exportsApi.cell(notebookId, entryId, c.id, 'json', revisionId)} download aria-label={`${c.label} as JSON`}>
                  JSON
                </a>
              </span>
            </div>
          ))}
        </div>
      )}
    </div>
  );
}
