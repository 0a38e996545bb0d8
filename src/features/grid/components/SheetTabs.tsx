// Sheet tabs along the bottom: switch, add, rename (double-click), move left/right or drag, delete.
import { useState } from 'react';
import { ConfirmDialog } from '../../../components/ui/Dialog.js';
import { LockIcon } from '../../../components/ui/icons.js';
import { ContextMenu } from '../../../components/ui/ContextMenu.js';
import { sheetNameSchema } from '@shared/workbooks.js';

export interface TabSheet {
  id: string;
  name: string;
  /** Set while the sheet is locked: the lock's summary (who, when, why), shown on the tab's hover. */
  lock?: string;
  /** Set when I may only view this sheet: why (my role, a role set on the sheet, or its lock). */
  viewOnly?: string;
  /** Why I may not rename, move or delete this tab, if I may not. */
  refusal?: string;
}

export interface SheetTabsProps {
  sheets: TabSheet[];
  activeId: string;
  canEdit: boolean;
  onSelect: (id: string) => void;
  onAdd: () => Promise<void>;
  onRename: (id: string, name: string) => Promise<void>;
  onMove: (id: string, position: number) => Promise<void>;
  onDelete: (id: string) => Promise<void>;
  footer?: React.ReactNode;
}

export function SheetTabs(p: SheetTabsProps) {
  const [renaming, setRenaming] = useState<{ id: string; name: string; error?: string } | null>(null);
  const [deleting, setDeleting] = useState<TabSheet | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [dragged, setDragged] = useState<string | null>(null);
  const [menu, setMenu] = useState<{ id: string; x: number; y: number } | null>(null);

  const run = async (action: () => Promise<void>) => {
    setBusy(true);
    setError(null);
    try {
      await action();
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  const commitRename = () => {
    if (!renaming) return;
    const parsed = sheetNameSchema.safeParse(renaming.name);
    if (!parsed.success) return setRenaming({ ...renaming, error: parsed.error.issues[0]?.message ?? 'not a valid name' });
    const { id } = renaming;
    setRenaming(null);
    if (parsed.data !== p.sheets.find((s) => s.id === id)?.name) void run(() => p.onRename(id, parsed.data));
  };

  const index = p.sheets.findIndex((s) => s.id === p.activeId);
  const activeRefusal = p.sheets[index]?.refusal;
  return (
    <div data-grid-shield="" onMouseDown={(e) => e.stopPropagation()} onKeyDown={(e) => e.stopPropagation()} className="flex h-8 shrink-0 items-stretch gap-0.5 border-t border-line bg-raised px-1 text-caption">
      <div role="tablist" aria-label="Sheets" className="flex min-w-0 items-stretch overflow-x-auto">
        {p.sheets.map((s, i) =>
          renaming?.id === s.id ? (
            <span key={s.id} className="flex items-center px-1">
              <input
                autoFocus
                aria-label="Sheet name"
                aria-invalid={!!renaming.error}
                title={renaming.error}
                value={renaming.name}
                onChange={(e) => setRenaming({ id: s.id, name: e.target.value })}
                onBlur={commitRename}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') commitRename();
                  if (e.key === 'Escape') setRenaming(null);
                }}
                className={`h-6 w-32 rounded-ctl border bg-surface px-1 font-mono text-caption ${renaming.error ? 'border-danger' : 'border-accent'}`}
              />
            </span>
          ) : (
            <button
              key={s.id}
              type="button"
              role="tab"
              aria-selected={s.id === p.activeId}
              draggable={p.canEdit && !s.refusal}
              onDragStart={() => setDragged(s.id)}
              onDragOver={(e) => dragged && e.preventDefault()}
              onDrop={() => {
                if (dragged && dragged !== s.id) void run(() => p.onMove(dragged, i));
                setDragged(null);
              }}
              onClick={() => p.onSelect(s.id)}
              onContextMenu={(e) => {
                e.preventDefault();
                p.onSelect(s.id);
                setMenu({ id: s.id, x: e.clientX, y: e.clientY });
              }}
              onDoubleClick={() => p.canEdit && !s.refusal && setRenaming({ id: s.id, name: s.name })}
              aria-label={s.lock ? `${s.name} (locked${s.viewOnly ? ', view only for you' : ''})` : s.viewOnly ? `${s.name} (view only for you)` : undefined}
              data-view-only={s.viewOnly ? '' : undefined}
              title={[s.viewOnly ?? s.lock, p.canEdit && !s.refusal ? 'Double-click to rename; drag to move' : s.name].filter(Boolean).join('\n')}
              className={`-mt-px flex max-w-48 items-center border-x border-b px-3 font-medium whitespace-nowrap ${
                s.id === p.activeId ? 'border-line bg-surface text-accent shadow-[inset_0_2px_0_var(--color-accent)]' : 'border-transparent text-ink-2 hover:bg-hover hover:text-ink'
              }`}
            >
              {s.lock && <LockIcon className="mr-1 shrink-0 text-ink-3" />}
              <span className={`truncate ${s.viewOnly ? 'italic' : ''}`}>{s.name}</span>
              {s.viewOnly && (
                <span aria-hidden="true" className="ml-1.5 rounded-sm border border-line-strong px-1 text-[10px] leading-4 font-semibold tracking-wide text-ink-3 uppercase not-italic">
                  read
                </span>
              )}
            </button>
          ),
        )}
      </div>
      {p.canEdit && (
        <div className="flex items-center gap-0.5 pl-1">
          <button type="button" aria-label="Add a sheet" title="Add a sheet" disabled={busy} onClick={() => void run(p.onAdd)} className="size-6 rounded-ctl text-ink-2 hover:bg-hover hover:text-ink">
            +
          </button>
          <button type="button" title={activeRefusal ?? 'Move this sheet left'} aria-label="Move sheet left" disabled={busy || index <= 0 || !!activeRefusal} onClick={() => void run(() => p.onMove(p.activeId, index - 1))} className="size-6 rounded-ctl text-ink-2 hover:bg-hover disabled:opacity-40">
            ‹
          </button>
          <button type="button" title={activeRefusal ?? 'Move this sheet right'} aria-label="Move sheet right" disabled={busy || index >= p.sheets.length - 1 || !!activeRefusal} onClick={() => void run(() => p.onMove(p.activeId, index + 1))} className="size-6 rounded-ctl text-ink-2 hover:bg-hover disabled:opacity-40">
            ›
          </button>
          <button type="button" title={activeRefusal ?? 'Rename this sheet'} disabled={busy || !!activeRefusal} onClick={() => setRenaming({ id: p.activeId, name: p.sheets[index]?.name ?? '' })} className="h-6 rounded-ctl px-1.5 text-ink-2 hover:bg-hover hover:text-ink disabled:opacity-40">
            Rename
          </button>
          <button
            type="button"
            title={activeRefusal ?? (p.sheets.length <= 1 ? 'A workbook keeps at least one sheet' : 'Delete this sheet')}
            disabled={busy || p.sheets.length <= 1 || !!activeRefusal} onClick={() => setDeleting(p.sheets[index] ?? null)} className="h-6 rounded-ctl px-1.5 text-ink-2 hover:bg-hover hover:text-danger disabled:opacity-40">
            Delete
          </button>
        </div>
      )}
      {error && (
        <span role="alert" className="flex items-center px-2 text-danger">
          {error}
        </span>
      )}
      <div className="ml-auto flex items-center">{p.footer}</div>
      {menu && (
        <ContextMenu
          at={menu}
          label="Sheet actions"
          onClose={() => setMenu(null)}
          groups={(() => {
            const i = p.sheets.findIndex((s) => s.id === menu.id);
            const sheet = p.sheets[i];
            const noEdit = p.canEdit ? null : 'You can view this workbook but not change its sheets';
            // Why this tab may not be renamed, moved or deleted by me (a lock or my role on it), as the buttons say.
            const blocked = noEdit ?? sheet?.refusal ?? null;
            return [
              [
                { label: 'Rename…', run: () => sheet && setRenaming({ id: sheet.id, name: sheet.name }), unavailable: blocked },
                { label: 'Move left', run: () => void run(() => p.onMove(menu.id, i - 1)), unavailable: blocked ?? (i <= 0 ? 'Already the first sheet' : null) },
                { label: 'Move right', run: () => void run(() => p.onMove(menu.id, i + 1)), unavailable: blocked ?? (i >= p.sheets.length - 1 ? 'Already the last sheet' : null) },
              ],
              [{ label: 'New sheet', run: () => void run(p.onAdd), unavailable: noEdit }],
              [{ label: 'Delete sheet…', run: () => setDeleting(sheet ?? null), unavailable: blocked ?? (p.sheets.length <= 1 ? 'A workbook keeps at least one sheet' : null) }],
            ];
          })()}
        />
      )}
      <ConfirmDialog
        open={deleting !== null}
        title="Delete sheet"
        confirmLabel="Delete sheet"
        busy={busy}
        onCancel={() => setDeleting(null)}
        onConfirm={() => {
          const target = deleting;
          setDeleting(null);
          if (target) void run(() => p.onDelete(target.id));
        }}
      >
        Delete “{deleting?.name}” and all its cells? Formulas on other sheets that use it will show #REF!. The sheet can be brought back by restoring an earlier revision.
      </ConfirmDialog>
    </div>
  );
}
