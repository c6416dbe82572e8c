import { useState, type FormEvent } from 'react';
import { REVIEW_LIMITS } from '@shared/api/reviews.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog, DialogActions } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert } from '@/components/ui/form.tsx';
import { Textarea } from '@/components/ui/input.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { ApiError } from '@/lib/api-error.ts';
import { useSubmitReview } from '../api/submit-review.ts';

/**
 * Ask the notebook's PIs to review the entry as it stands (its head revision), with an optional
 * note for them. The PIs get an e-mail; the entry shows "In review" until they decide.
 */
export function SubmitForReviewButton({
  notebookId,
  entryId,
  revisionId,
  disabled,
  label = 'Submit for review',
}: {
  notebookId: string;
  entryId: string;
  revisionId: string;
  disabled?: boolean;
  label?: string;
}) {
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState('');
  const submit = useSubmitReview(notebookId, entryId);
  const close = () => {
    setOpen(false);
    submit.reset();
  };
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    submit.mutate(
      { revisionId, note },
      {
        onSuccess: () => {
          toast.show({ tone: 'success', title: 'Submitted for review', message: 'The notebook’s PIs have been told.' });
          setNote('');
          setOpen(false);
        },
      },
    );
  };
  const error = submit.error instanceof ApiError ? submit.error : null;
  return (
    <>
      <Button variant="secondary" size="sm" disabled={disabled} onClick={() => setOpen(true)}>
        {label}
      </Button>
      <Dialog open={open} onClose={close} title="Submit for review" description="The PIs of this notebook will be asked to review the entry as recorded now.">
        <form onSubmit={onSubmit} className="space-y-4">
          {error && <FormAlert>{error.message}</FormAlert>}
          <Field label="Note for the reviewer" help="Optional: what changed, what to look at first." error={error?.fieldMessage('note')}>
            <Textarea rows={4} maxLength={REVIEW_LIMITS.noteMax} value={note} onChange={(e) => setNote(e.target.value)} />
          </Field>
          <DialogActions onCancel={close} submitLabel="Submit" busy={submit.isPending} />
        </form>
      </Dialog>
    </>
  );
}
