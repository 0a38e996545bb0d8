import { useState, type FormEvent, type KeyboardEvent } from 'react';
import { Link } from 'react-router';
import { allows, roleLabels } from '@shared/permissions.js';
import { renameWorkbookSchema, workbookPath, type WorkbookSummary } from '@shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { SheetIcon } from '../../components/ui/icons.js';
import { checkForm, errorsFromApi } from '../../lib/fieldErrors.js';
import { useRenameWorkbook } from './api.js';
import { timeAgo } from '../../lib/relativeTime.js';


/** One workbook in the list: open it, rename it in place, or ask to delete it. */
export function WorkbookRow({ workbook, myId, onDelete }: { workbook: WorkbookSummary; myId: string | undefined; onDelete: () => void }) {
  const [renaming, setRenaming] = useState(false);
  const [error, setError] = useState<string>();
  const rename = useRenameWorkbook();
  const href = workbookPath(workbook.id);

  function stopRenaming() {
    setRenaming(false);
    setError(undefined);
    rename.reset();
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const checked = checkForm(renameWorkbookSchema, { title: new FormData(event.currentTarget).get('title') });
    if ('errors' in checked) return setError(checked.errors.fields.title ?? checked.errors.form);
    if (checked.data.title === workbook.title) return stopRenaming();
    rename.mutate(
      { id: workbook.id, title: checked.data.title },
      {
        onSuccess: stopRenaming,
        onError: (e) => {
          const errors = errorsFromApi(e, ['title']);
          setError(errors.fields.title ?? errors.form);
        },
      },
    );
  }

  const cancelOnEscape = (e: KeyboardEvent) => {
    if (e.key === 'Escape') {
      e.preventDefault();
      stopRenaming();
    }
  };

  return (
    <tr className="group border-b border-line last:border-b-0 hover:bg-raised">
      <td className="px-3 py-1">
        {renaming ? (
          <form onSubmit={submit} noValidate className="flex flex-col gap-1 py-0.5">
            <div className="flex items-center gap-1.5">
              <input
                name="title"
                aria-label={`New title for ${workbook.title}`}
                aria-invalid={error ? true : undefined}
                defaultValue={workbook.title}
                maxLength={200}
                autoFocus
                onFocus={(e) => e.currentTarget.select()}
                onKeyDown={cancelOnEscape}
                className={`h-7 min-w-0 flex-1 rounded-ctl border bg-surface px-2 text-ui ${error ? 'border-danger' : 'border-line-strong'}`}
              />
              <Button type="submit" variant="primary" busy={rename.isPending}>
                Save
              </Button>
              <Button onClick={stopRenaming}>Cancel</Button>
            </div>
            {error && (
              <p role="alert" className="text-caption text-danger">
                {error}
              </p>
            )}
          </form>
        ) : (
          <Link to={href} className="flex h-7 items-center gap-2 font-medium text-ink hover:text-accent">
            <span className="text-ink-3 group-hover:text-accent">
              <SheetIcon />
            </span>
            <span className="truncate">{workbook.title}</span>
          </Link>
        )}
      </td>
      <td className="px-3 py-1 text-ink-2">{workbook.owner.id === myId ? 'You' : workbook.owner.name}</td>
      <td className="px-3 py-1 text-ink-3">{roleLabels[workbook.role]}</td>
      <td className="px-3 py-1 text-ink-3 tabular-nums" title={new Date(workbook.updatedAt).toLocaleString()}>
        {timeAgo(workbook.updatedAt)}
      </td>
      <td className="py-1 pr-2 pl-3 text-right whitespace-nowrap">
        {!renaming && (
          <span className="inline-flex gap-0.5">
            {allows(workbook.actions, 'rename') && (
              <Button variant="ghost" onClick={() => setRenaming(true)} aria-label={`Rename ${workbook.title}`}>
                Rename
              </Button>
            )}
            {allows(workbook.actions, 'delete') && (
              <Button variant="ghost" className="hover:text-danger" onClick={onDelete} aria-label={`Delete ${workbook.title}`}>
                Delete
              </Button>
            )}
          </span>
        )}
      </td>
    </tr>
  );
}
