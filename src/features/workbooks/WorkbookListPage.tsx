import { useState } from 'react';
import type { WorkbookSummary } from '../../../shared/workbooks.js';
import { Button } from '../../components/ui/Button.js';
import { ConfirmDialog } from '../../components/ui/Dialog.js';
import { PlusIcon } from '../../components/ui/icons.js';
import { Notice } from '../../components/ui/Notice.js';
import { LoadingRows, Page } from '../../components/ui/Page.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useMe } from '../../core/session/me.js';
import type { ReactNode } from 'react';
import { useDeleteWorkbook, useWorkbooks } from './api.js';
import { NewWorkbookDialog } from './NewWorkbookDialog.js';
import { WorkbookRow } from './WorkbookRow.js';

/** `importControl`: the file-import button, composed in by the app (src/app/router.tsx). */
export function WorkbookListPage({ importControl }: { importControl?: ReactNode }) {
  const workbooks = useWorkbooks();
  const me = useMe().data;
  const remove = useDeleteWorkbook();
  const [creating, setCreating] = useState(false);
  const [deleting, setDeleting] = useState<WorkbookSummary | null>(null);

  const newButton = (
    <Button variant="primary" onClick={() => setCreating(true)}>
      <PlusIcon />
      New workbook
    </Button>
  );
  const startButtons = (
    <div className="flex items-center gap-2">
      {importControl}
      {newButton}
    </div>
  );
  const count = workbooks.data?.length;

  return (
    <Page
      title="Workbooks"
      description={!count ? undefined : count === 1 ? '1 workbook you can open' : `${count} workbooks you can open`}
      actions={count ? startButtons : undefined}
    >
      <title>Workbooks · Orbitab</title>
      {workbooks.isPending ? (
        <LoadingRows label="Loading workbooks" />
      ) : workbooks.isError ? (
        <Notice tone="error" title="Could not load your workbooks">
          {sentence(workbooks.error.message)}
        </Notice>
      ) : workbooks.data.length === 0 ? (
        <div className="flex flex-col items-start gap-3 rounded-panel border border-dashed border-line-strong bg-surface px-6 py-8">
          <div>
            <h2 className="text-title font-semibold">No workbooks yet</h2>
            <p className="mt-1 max-w-prose text-ink-2">
              A workbook holds sheets of candidate species, one per row, and the formulas that compute their electronic structure: bond order,
              unpaired electrons, ground term and more.
            </p>
          </div>
          {startButtons}
        </div>
      ) : (
        <div className="overflow-hidden rounded-panel border border-line bg-surface">
          <table className="w-full table-fixed border-collapse text-left text-ui">
            <thead className="bg-raised text-caption text-ink-3">
              <tr className="border-b border-line">
                <th className="px-3 py-1.5 font-medium">Title</th>
                <th className="w-40 px-3 py-1.5 font-medium">Owner</th>
                <th className="w-28 px-3 py-1.5 font-medium">Your role</th>
                <th className="w-36 px-3 py-1.5 font-medium">Last changed</th>
                <th className="w-44 px-3 py-1.5">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {workbooks.data.map((workbook) => (
                <WorkbookRow key={workbook.id} workbook={workbook} myId={me?.id} onDelete={() => setDeleting(workbook)} />
              ))}
            </tbody>
          </table>
        </div>
      )}
      <NewWorkbookDialog open={creating} onClose={() => setCreating(false)} />
      <ConfirmDialog
        open={deleting !== null}
        title="Delete workbook?"
        confirmLabel="Delete workbook"
        busy={remove.isPending}
        error={remove.isError ? sentence(remove.error.message) : undefined}
        onCancel={() => {
          setDeleting(null);
          remove.reset();
        }}
        onConfirm={() => deleting && remove.mutate(deleting.id, { onSuccess: () => setDeleting(null) })}
      >
        <strong className="font-semibold text-ink">{deleting?.title}</strong> and all its sheets and revision history are deleted for everyone who
        can open it. This cannot be undone.
      </ConfirmDialog>
    </Page>
  );
}
