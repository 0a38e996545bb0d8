// "Import…": pick or drop an .xlsx or .csv file, or structures (.sdf, .mol, .xyz), watch it upload, read what was taken. Without a
// workbookId the file becomes a new workbook; with one, its sheets are added to that workbook.
import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState, type DragEvent } from 'react';
import { useNavigate } from 'react-router';
import { acceptedUploadTypes, maxUploadBytes, type ImportResponse } from '@shared/io.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { ApiError, queryKeys } from '../../lib/api.js';
import { ImportSummaryView } from './ImportSummaryView.js';
import { uploadSpreadsheet, type UploadProgress } from './upload.js';
import { workbookPath } from '@shared/workbooks.js';

type Stage = { kind: 'choose' } | { kind: 'uploading'; file: File; progress: UploadProgress } | { kind: 'done'; result: ImportResponse } | { kind: 'failed'; file?: File; message: string };

const megabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

export function ImportButton({
  workbookId,
  label = 'Import…',
  onImported,
  variant,
  className,
  disabled,
  title,
}: {
  workbookId?: string;
  label?: string;
  onImported?: (result: ImportResponse) => void;
  variant?: 'secondary' | 'ghost';
  className?: string;
  disabled?: boolean;
  title?: string;
}) {
  const [open, setOpen] = useState(false);
  const [stage, setStage] = useState<Stage>({ kind: 'choose' });
  const [dragging, setDragging] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const abort = useRef<AbortController | null>(null);
  const queryClient = useQueryClient();
  const navigate = useNavigate();

  function close() {
    abort.current?.abort();
    setStage({ kind: 'choose' });
    setOpen(false);
  }

  async function send(file: File) {
    if (file.size > maxUploadBytes) {
      setStage({ kind: 'failed', file, message: `${file.name} is ${megabytes(file.size)}; the limit is ${megabytes(maxUploadBytes)}.` });
      return;
    }
    abort.current = new AbortController();
    setStage({ kind: 'uploading', file, progress: { loaded: 0, total: file.size } });
    try {
      const result = await uploadSpreadsheet(file, { workbookId, signal: abort.current.signal, onProgress: (progress) => setStage({ kind: 'uploading', file, progress }) });
      setStage({ kind: 'done', result });
      void queryClient.invalidateQueries({ queryKey: queryKeys.workbooks, exact: true });
      void queryClient.invalidateQueries({ queryKey: queryKeys.workbook(result.workbookId) });
      onImported?.(result);
    } catch (e) {
      if (e instanceof ApiError && e.code === 'aborted') return;
      setStage({ kind: 'failed', file, message: e instanceof Error ? e.message.replace(/^file: /, '') : String(e) });
    }
  }

  function onDrop(e: DragEvent<HTMLDivElement>) {
    e.preventDefault();
    setDragging(false);
    const file = e.dataTransfer.files[0];
    if (file) void send(file);
  }

  const uploading = stage.kind === 'uploading';
  const percent = uploading ? Math.round((100 * stage.progress.loaded) / Math.max(1, stage.progress.total)) : 0;

  return (
    <>
      <Button variant={variant} className={className} disabled={disabled} title={title} onClick={() => setOpen(true)}>
        {label}
      </Button>
      <Dialog
        open={open}
        onClose={close}
        title={workbookId ? 'Add sheets from a file' : 'Import a workbook'}
        width="w-[32rem]"
        footer={
          stage.kind === 'done' ? (
            <>
              <Button onClick={close}>Close</Button>
              {!workbookId && (
                <Button variant="primary" onClick={() => (close(), navigate(workbookPath(stage.result.workbookId)))}>
                  Open workbook
                </Button>
              )}
            </>
          ) : (
            <Button onClick={close}>{uploading ? 'Cancel' : 'Close'}</Button>
          )
        }
      >
        {stage.kind === 'done' ? (
          <ImportSummaryView summary={stage.result.summary} />
        ) : (
          <div className="flex flex-col gap-3">
            <div
              data-testid="import-drop-zone"
              onDragOver={(e) => (e.preventDefault(), setDragging(true))}
              onDragLeave={() => setDragging(false)}
              onDrop={onDrop}
              className={`flex flex-col items-center gap-2 rounded-panel border border-dashed px-4 py-6 text-center ${dragging ? 'border-accent bg-accent-soft' : 'border-line-strong bg-raised'}`}
            >
              <p className="text-ink">Drop an .xlsx or .csv file, or structures (.sdf, .mol, .xyz), here</p>
              <Button disabled={uploading} onClick={() => input.current?.click()}>
                Choose a file…
              </Button>
              <input
                ref={input}
                type="file"
                accept={acceptedUploadTypes}
                className="sr-only"
                aria-label="Spreadsheet file"
                onChange={(e) => {
                  const file = e.target.files?.[0];
                  e.target.value = '';
                  if (file) void send(file);
                }}
              />
              <p className="text-caption text-ink-3">Every sheet, value and formula is kept; up to {megabytes(maxUploadBytes)}.</p>
              <p className="text-caption text-ink-3">
                Structures become one row each. XYZ frames have no bonds, so theirs are guessed from distances and usual valences: check the
                SMILES of ions (write “charge=-1” in the comment line), radicals and metal compounds.
              </p>
            </div>
            {uploading && (
              <div className="flex flex-col gap-1">
                <p className="truncate text-ink">{stage.file.name}</p>
                <div role="progressbar" aria-label="Upload" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className="h-1.5 overflow-hidden rounded-full bg-sunken">
                  <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
                </div>
                <p className="text-caption text-ink-3">{percent < 100 ? `Uploading… ${percent}%` : 'Reading the file on the server…'}</p>
              </div>
            )}
            {stage.kind === 'failed' && (
              <Notice tone="error" title={stage.file ? `${stage.file.name} was not imported` : 'Not imported'}>
                {stage.message}
              </Notice>
            )}
          </div>
        )}
      </Dialog>
    </>
  );
}
