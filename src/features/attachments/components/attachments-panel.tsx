import { useId, useRef, useState, type DragEvent } from 'react';
import { ATTACHMENT_ACCEPT, INLINE_IMAGE_TYPES, type Attachment } from '@shared/api/attachments.ts';
import { Button } from '@/components/ui/button.tsx';
import { ConfirmButton } from '@/components/ui/dialog.tsx';
import { formatDateTime } from '@/lib/format.ts';
import { isApiError } from '@/lib/api-error.ts';
import { useAttachments } from '../api/get-attachments.ts';
import { useRemoveAttachment } from '../api/remove-attachment.ts';
import { useUploadAttachment } from '../api/upload-attachment.ts';

interface Upload {
  key: number;
  name: string;
  fraction: number;
  error?: string;
}

export function formatSize(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  if (bytes >= 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${bytes} bytes`;
}

/**
 * The files of an entry: drop files on the panel or pick them, watch each upload's progress,
 * download, remove, and place images in the text. Belongs beside the entry document.
 */
export function AttachmentsPanel(props: {
  notebookId: string;
  entryId: string;
  /** Researchers and PIs may upload and remove; readers only download. */
  canWrite: boolean;
  /** Places an image in the document at the cursor (the editor's image node takes `src` and `alt`). */
  onPlaceImage?: (image: { src: string; alt: string }) => void;
}) {
  const { notebookId, entryId, canWrite } = props;
  const list = useAttachments(notebookId, entryId);
  const upload = useUploadAttachment(notebookId, entryId);
  const remove = useRemoveAttachment(notebookId, entryId);
  const [uploads, setUploads] = useState<Upload[]>([]);
  const [dragging, setDragging] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);
  const counter = useRef(0);
  const headingId = useId();

  const send = (files: FileList | File[]) => {
    for (const file of Array.from(files)) {
      const key = ++counter.current;
      setUploads((u) => [...u, { key, name: file.name, fraction: 0 }]);
      const update = (patch: Partial<Upload>) => setUploads((u) => u.map((x) => (x.key === key ? { ...x, ...patch } : x)));
      upload.mutate(
        { file, onProgress: (fraction) => update({ fraction }) },
        {
          onSuccess: () => setUploads((u) => u.filter((x) => x.key !== key)),
          onError: (e) => update({ error: isApiError(e) ? e.message : 'The upload failed' }),
        },
      );
    }
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    if (canWrite && e.dataTransfer.files.length) send(e.dataTransfer.files);
  };

  return (
    <section
      aria-labelledby={headingId}
      data-testid="attachments-panel"
      onDragOver={(e) => {
        if (!canWrite) return;
        e.preventDefault();
        setDragging(true);
      }}
      onDragLeave={() => setDragging(false)}
      onDrop={onDrop}
      className={`rounded-lg border bg-surface p-4 ${dragging ? 'border-accent ring-2 ring-accent' : 'border-rule'}`}
    >
      <div className="flex items-center justify-between gap-3">
        <h2 id={headingId} className="font-serif text-lg font-bold text-ink">
          Attachments
        </h2>
        {canWrite && (
          <>
            <input
              ref={inputRef}
              type="file"
              multiple
              accept={ATTACHMENT_ACCEPT}
              className="sr-only"
              aria-label="Choose files to attach"
              onChange={(e) => {
                if (e.target.files) send(e.target.files);
                e.target.value = '';
              }}
            />
            <Button variant="secondary" size="sm" onClick={() => inputRef.current?.click()}>
              Attach files…
            </Button>
          </>
        )}
      </div>
      {canWrite && <p className="mt-1 text-sm text-ink-muted">Drop images, PDF, CSV or text files here (up to 25 MB each).</p>}

      {uploads.length > 0 && (
        <ul aria-label="Uploads in progress" className="mt-3 space-y-2">
          {uploads.map((u) => (
            <li key={u.key} className="text-sm">
              <div className="flex items-center justify-between gap-2">
                <span className="truncate">{u.name}</span>
                {u.error ? (
                  <button type="button" className="text-accent underline" onClick={() => setUploads((x) => x.filter((y) => y.key !== u.key))}>
                    Dismiss
                  </button>
                ) : (
                  <span>{Math.round(u.fraction * 100)}%</span>
                )}
              </div>
              {u.error ? (
                <p role="alert" className="text-unstable">
                  {u.error}
                </p>
              ) : (
                <progress className="h-2 w-full" max={1} value={u.fraction} aria-label={`Uploading ${u.name}`} />
              )}
            </li>
          ))}
        </ul>
      )}

      {list.isPending ? (
        <p className="mt-3 text-sm text-ink-muted">Loading attachments…</p>
      ) : list.isError ? (
        <p role="alert" className="mt-3 text-sm text-unstable">
          The attachments could not be loaded.
        </p>
      ) : list.data.attachments.length === 0 ? (
        <p className="mt-3 text-sm text-ink-muted">No files attached yet.</p>
      ) : (
        <ul aria-label="Attached files" className="mt-3 divide-y divide-rule">
          {list.data.attachments.map((a) => (
            <AttachmentRow key={a.id} a={a} canWrite={canWrite} onPlaceImage={props.onPlaceImage} onRemove={() => remove.mutate(a.id)} />
          ))}
        </ul>
      )}
    </section>
  );
}

function AttachmentRow(props: { a: Attachment; canWrite: boolean; onPlaceImage?: (image: { src: string; alt: string }) => void; onRemove: () => void }) {
  const { a } = props;
  const isImage = INLINE_IMAGE_TYPES.includes(a.contentType);
  return (
    <li className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
      <div className="min-w-0">
        <a href={a.contentUrl} className="font-medium text-accent underline" target="_blank" rel="noreferrer">
          {a.name}
        </a>
        <p className="text-xs text-ink-muted">
          {formatSize(a.byteSize)} · {a.uploadedBy.name} · {formatDateTime(a.createdAt)} · <span title={`SHA-256 ${a.sha256}`}>SHA-256 {a.sha256.slice(0, 12)}…</span>
        </p>
      </div>
      <div className="flex gap-2">
        {isImage && props.canWrite && props.onPlaceImage && (
          <Button variant="quiet" size="sm" onClick={() => props.onPlaceImage?.({ src: a.contentUrl, alt: a.name })}>
            Place in text
          </Button>
        )}
        {props.canWrite && (
          <ConfirmButton
            label="Remove"
            accessibleLabel={`Remove ${a.name}`}
            variant="quiet"
            title={`Remove ${a.name}?`}
            description="It leaves this entry's files and can no longer be downloaded from here; the audit trail keeps its name and hash."
            keepLabel="Keep it"
            confirmLabel="Remove"
            onConfirm={(close) => {
              close();
              props.onRemove();
            }}
          />
        )}
      </div>
    </li>
  );
}
