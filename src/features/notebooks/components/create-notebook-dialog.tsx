import { useState } from 'react';
import { useNavigate } from 'react-router';
import { LIMITS } from '@shared/domain/limits.ts';
import { paths } from '@/config/paths.ts';
import { Button } from '@/components/ui/button.tsx';
import { Dialog, DialogActions } from '@/components/ui/dialog.tsx';
import { Field } from '@/components/ui/field.tsx';
import { FormAlert, useZodForm } from '@/components/ui/form.tsx';
import { Input, Textarea } from '@/components/ui/input.tsx';
import { createNotebookSchema, useCreateNotebook } from '../api/create-notebook.ts';

export function CreateNotebookButton() {
  const [open, setOpen] = useState(false);
  const form = useZodForm(createNotebookSchema, { title: '', description: '' });
  const create = useCreateNotebook();
  const navigate = useNavigate();
  const close = () => {
    setOpen(false);
    form.reset();
  };
  return (
    <>
      <Button onClick={() => setOpen(true)}>New notebook</Button>
      <Dialog
        open={open}
        onClose={close}
        title="New notebook"
        description="You will be its principal investigator and can add members afterwards."
      >
        <form
          noValidate
          className="space-y-4"
          onSubmit={form.handleSubmit((d) =>
            create.mutate(d, {
              onSuccess: (nb) => {
                close();
                void navigate(paths.notebook.getHref(nb.id));
              },
              onError: form.applyError,
            }),
          )}
        >
          <FormAlert>{form.formError}</FormAlert>
          <Field
            label="Title"
            help={`The study's subject, up to ${LIMITS.notebookTitleMax} characters.`}
            error={form.errors.title}
          >
            <Input autoFocus {...form.bind('title')} />
          </Field>
          <Field
            label="What the study is about"
            help="Optional. The model, the question, the parameters of interest."
            error={form.errors.description}
          >
            <Textarea rows={4} {...form.bind('description')} />
          </Field>
          <DialogActions onCancel={close} submitLabel="Create notebook" busy={create.isPending} />
        </form>
      </Dialog>
    </>
  );
}
