import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { createWorkbookSchema, workbookPath } from '@shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, type FormErrors } from '../../lib/fieldErrors.js';
import { useCreateWorkbook } from './api.js';

/** Asks for a title, creates the workbook and opens it. */
export function NewWorkbookDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const create = useCreateWorkbook();
  const navigate = useNavigate();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function close() {
    setErrors({ fields: {} });
    create.reset();
    onClose();
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const checked = checkForm(createWorkbookSchema, { title: new FormData(event.currentTarget).get('title') });
    if ('errors' in checked) return setErrors(checked.errors);
    create.mutate(checked.data, {
      onSuccess: (workbook) => navigate(workbookPath(workbook.id)),
      onError: (error) => setErrors(errorsFromApi(error, ['title'])),
    });
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      title="New workbook"
      footer={
        <>
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" form="new-workbook" variant="primary" busy={create.isPending}>
            Create and open
          </Button>
        </>
      }
    >
      <form id="new-workbook" noValidate onSubmit={submit} className="flex flex-col gap-3">
        {errors.form && <Notice tone="error">{errors.form}</Notice>}
        <TextField label="Title" name="title" autoFocus placeholder="e.g. Diatomic screen, batch 3" maxLength={200} error={errors.fields.title} />
      </form>
    </Dialog>
  );
}
