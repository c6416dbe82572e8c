import { useState, type FormEvent } from 'react';
import { ERROR_CODES } from '@shared/api/errors.ts';
import { REVIEW_LIMITS, SIGNATURE_MEANING_LABELS } from '@shared/api/reviews.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog, DialogActions } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert } from '@/components/ui/form.tsx';
import { Input, Textarea } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { useApproveReview, useRequestChanges } from '../api/decide-review.ts';
import { useReproducibility } from '../api/get-reproducibility.ts';
import { ReproducibilityResult } from './reproducibility-result.tsx';
import { ElapsedProgress } from '@/components/ui/elapsed-progress.tsx';

interface DecisionProps {
  notebookId: string;
  entryId: string;
  /** The revision the decision is about (the review's current revision). */
  revisionId: string;
  disabled?: boolean;
  onDone?: () => void;
}

/** Send the entry back with a comment saying what should change (the comment is required). */
export function RequestChangesButton({ notebookId, entryId, revisionId, disabled, onDone }: DecisionProps) {
  const [open, setOpen] = useState(false);
  const [comment, setComment] = useState('');
  const request = useRequestChanges(notebookId, entryId);
  const close = () => {
    setOpen(false);
    request.reset();
  };
  const error = request.error instanceof ApiError ? request.error : null;
  const [missing, setMissing] = useState(false);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (comment.trim() === '') {
      setMissing(true);
      return;
    }
    request.mutate(
      { revisionId, comment },
      {
        onSuccess: () => {
          toast.show({ tone: 'success', title: 'Changes requested', message: 'The author has been told.' });
          setComment('');
          setOpen(false);
          onDone?.();
        },
      },
    );
  };
  return (
    <>
      <Button variant="secondary" disabled={disabled} onClick={() => setOpen(true)}>
        Request changes
      </Button>
      <Dialog open={open} onClose={close} title="Request changes" description="The entry goes back to its author with your comment.">
        <form onSubmit={submit} className="space-y-4" noValidate>
          {error && <FormAlert>{error.message}</FormAlert>}
          <Field label="What should change" error={missing ? 'Say what should change' : error?.fieldMessage('comment')}>
            <Textarea rows={5} maxLength={REVIEW_LIMITS.commentMax} value={comment} onChange={(e) => { setComment(e.target.value); setMissing(false); }} />
          </Field>
          <DialogActions onCancel={close} submitLabel="Request changes" busy={request.isPending} />
        </form>
      </Dialog>
    </>
  );
}

/**
 * Approve with an electronic signature. The dialog states the meaning of the signature and the
 * signer's printed name, reruns every cell first and shows the outcome, then asks for the
 * password. When the rerun differs, signing needs an explicit "approve with these differences".
 */
export function ApproveButton({ notebookId, entryId, revisionId, disabled, onDone, signerName }: DecisionProps & { signerName: string }) {
  const [open, setOpen] = useState(false);
  const [password, setPassword] = useState('');
  const [accept, setAccept] = useState(false);
  const approve = useApproveReview(notebookId, entryId);
  const check = useReproducibility(notebookId, entryId, revisionId, open);
  const close = () => {
    setOpen(false);
    setPassword('');
    setAccept(false);
    approve.reset();
  };
  const error = approve.error instanceof ApiError ? approve.error : null;
  const differs = check.data?.status === 'differs';
  const submit = (e: FormEvent) => {
    e.preventDefault();
    approve.mutate(
      { revisionId, password, acceptDifferences: accept },
      {
        onSuccess: () => {
          toast.show({ tone: 'success', title: 'Approved and signed' });
          close();
          onDone?.();
        },
        onError: () => setPassword(''),
      },
    );
  };
  const message = error
    ? error.code === 'signature_failed'
      ? 'That password is not right. Your signature was not applied.'
      : error.code === ERROR_CODES.conflict
        ? 'A newer revision is under review now. Close this and review it first.'
        : error.message
    : null;
  return (
    <>
      <Button disabled={disabled} onClick={() => setOpen(true)}>
        Approve…
      </Button>
      <Dialog open={open} onClose={close} title="Approve and sign" description="Your electronic signature is bound to this revision's content and kept on the record.">
        <form onSubmit={submit} className="space-y-4">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-muted">Meaning</dt>
            <dd className="font-semibold">{SIGNATURE_MEANING_LABELS.approved}</dd>
            <dt className="text-ink-muted">Printed name</dt>
            <dd className="font-semibold">{signerName}</dd>
          </dl>
          <section aria-label="Reproducibility check">
            <h3 className="mb-1 text-sm font-medium">Reproducibility</h3>
            {check.isPending && <ElapsedProgress label="Rerunning every cell of this revision" />}
            {check.isError && <QueryError error={check.error} what="the reproducibility check" onRetry={() => void check.refetch()} />}
            {check.data && <ReproducibilityResult report={check.data} />}
          </section>
          {differs && (
            <label className="flex items-start gap-2 text-sm">
              <input type="checkbox" className="mt-1" checked={accept} onChange={(e) => setAccept(e.target.checked)} />
              <span>Approve with these differences; they will be shown on the record with my signature.</span>
            </label>
          )}
          {message && <FormAlert>{message}</FormAlert>}
          <Field label="Your password" help="Typed again to sign.">
            <Input type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} required />
          </Field>
          <DialogActions onCancel={close} submitLabel="Sign and approve" busy={approve.isPending || check.isPending} />
        </form>
      </Dialog>
    </>
  );
}
