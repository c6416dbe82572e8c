import { useState } from 'react';
import { ENTRY_LIMITS } from '@shared/api/entries.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { Textarea } from '@/components/ui/input.tsx';

/** Record the working copy as a revision, with an optional message saying what changed. */
export function RecordRevisionDialog({
  open,
  onClose,
  onRecord,
  busy,
  error,
  nextNumber,
}: {
  open: boolean;
  onClose: () => void;
  onRecord: (message: string) => void;
  busy: boolean;
  error?: string;
  nextNumber: number;
}) {
  const [message, setMessage] = useState('');
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={`Record revision #${nextNumber}`}
      description="A revision is a fixed copy of the entry, cells and outputs included, that can be reviewed and signed."
    >
      <form
        className="space-y-4"
        onSubmit={(e) => {
          e.preventDefault();
          onRecord(message.trim());
        }}
      >
        <Field
          label="What changed (optional)"
          error={error}
          help={`At most ${ENTRY_LIMITS.messageMax} characters.`}
        >
          <Textarea
            rows={3}
            maxLength={ENTRY_LIMITS.messageMax}
            value={message}
            onChange={(e) => setMessage(e.target.value)}
            placeholder="Followed the upper branch past the second fold"
            autoFocus
          />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" busy={busy}>
            Record revision
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
