// Protected ranges of one sheet: a block of cells (A1 notation) only the named people may change.
// Everyone sees the list; owners (any sheet) and editors (sheets they created) add and remove.
import { useState, type FormEvent } from 'react';
import { protectedRangeSchema, type Member, type ProtectedRange } from '@shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useProtectRange, useUnprotectRange } from './api.js';
import { EditorPicker } from './EditorPicker.js';

export function ProtectedRangesSection({
  workbookId,
  sheetId,
  ranges,
  members,
  myId,
  canProtect,
  suggestedRange,
}: {
  workbookId: string;
  sheetId: string;
  ranges: ProtectedRange[];
  members: Member[];
  myId: string;
  canProtect: boolean;
  /** The selected cells, offered as the range to protect. */
  suggestedRange?: string;
}) {
  const protect = useProtectRange(workbookId);
  const unprotect = useUnprotectRange(workbookId);
  const [editors, setEditors] = useState<string[]>([]);
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const checked = checkForm(protectedRangeSchema, { range: new FormData(form).get('range'), editors });
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    protect.mutate(
      { sheetId, ...checked.data },
      {
        onSuccess: () => {
          form.reset();
          setEditors([]);
        },
        onError: (e) => setErrors(errorsFromApi(e, ['range', 'editors'])),
      },
    );
  }

  return (
    <section aria-labelledby="ranges-heading" className="mt-4">
      <h3 id="ranges-heading" className="mb-1.5 text-caption font-semibold tracking-wide text-ink-3 uppercase">
        Protected ranges
      </h3>
      {ranges.length === 0 ? (
        <p className="mb-2 text-ink-3">No protected ranges on this sheet.</p>
      ) : (
        <ul aria-label="Protected ranges" className="mb-2.5 flex flex-col divide-y divide-line rounded-ctl border border-line">
          {ranges.map((r) => (
            <li key={r.id} aria-label={`Range ${r.range}`} className="flex items-center gap-2 px-2.5 py-1.5">
              <code className="w-24 shrink-0 font-semibold text-ink">{r.range}</code>
              <p className="min-w-0 flex-1 truncate text-caption text-ink-2" title={r.editors.map((e) => e.name).join(', ')}>
                Editable by {r.editors.map((e) => e.name).join(', ')}
              </p>
              {canProtect && (
                <Button
                  variant="ghost"
                  className="hover:text-danger"
                  busy={unprotect.isPending && unprotect.variables?.rangeId === r.id}
                  onClick={() => unprotect.mutate({ sheetId, rangeId: r.id })}
                  aria-label={`Remove protection from ${r.range}`}
                >
                  Remove
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {unprotect.isError && (
        <p role="alert" className="mb-1.5 text-caption text-danger">
          {sentence(unprotect.error.message)}
        </p>
      )}
      {canProtect && (
        <form noValidate onSubmit={submit} className="flex flex-col gap-2.5 rounded-ctl border border-line bg-raised px-3 py-2.5">
          <div className="flex items-end gap-2">
            <TextField
              label="Range to protect"
              name="range"
              defaultValue={suggestedRange}
              key={suggestedRange}
              hint="Starts as the cells selected when you opened this; or type a cell (B2), a block (A1:C3), columns (A:C) or rows (2:5)."
              error={errors.fields.range}
              className="flex-1"
            />
          </div>
          <EditorPicker legend="Who else may edit inside it" members={members} myId={myId} selected={editors} onChange={setEditors} />
          {errors.form && (
            <p role="alert" className="text-caption text-danger">
              {errors.form}
            </p>
          )}
          <div>
            <Button type="submit" variant="primary" busy={protect.isPending}>
              Protect range
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
