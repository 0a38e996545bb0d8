// "Export": downloads straight from GET /api/workbooks/:id/export, so the browser streams the file
// to disk. The workbook with formulas and cached values, values only, or the active sheet as CSV.
import { useEffect, useRef, useState } from 'react';
import { exportPath } from '@shared/io.js';
import { Button } from '../../components/ui/Button.js';

export function ExportMenu({ workbookId, activeSheet }: { workbookId: string; activeSheet?: { id: string; name: string } }) {
  const [open, setOpen] = useState(false);
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const onPointer = (e: PointerEvent) => box.current && !box.current.contains(e.target as Node) && setOpen(false);
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && setOpen(false);
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  const item = 'flex flex-col rounded-ctl px-2 py-1.5 text-left hover:bg-hover focus:bg-hover focus:outline-none';
  return (
    <div ref={box} className="relative">
      <Button aria-haspopup="menu" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
        Export
      </Button>
      {open && (
        <div role="menu" aria-label="Export" className="absolute right-0 z-40 mt-1 flex w-72 flex-col rounded-panel border border-line bg-surface p-1 text-ui shadow-lg">
          <a role="menuitem" className={item} href={exportPath(workbookId, 'xlsx')} download onClick={() => setOpen(false)}>
            <span className="font-medium text-ink">Workbook (.xlsx)</span>
            <span className="text-caption text-ink-3">Formulas with Orbitab’s values cached beside them</span>
          </a>
          <a role="menuitem" className={item} href={exportPath(workbookId, 'xlsx-values')} download onClick={() => setOpen(false)}>
            <span className="font-medium text-ink">Values only (.xlsx)</span>
            <span className="text-caption text-ink-3">For programs that do not know Orbitab’s functions</span>
          </a>
          {activeSheet && (
            <a role="menuitem" className={item} href={exportPath(workbookId, 'csv', activeSheet.id)} download onClick={() => setOpen(false)}>
              <span className="font-medium text-ink">Sheet “{activeSheet.name}” (.csv)</span>
              <span className="text-caption text-ink-3">Values; text that could run as a formula is escaped</span>
            </a>
          )}
          <p className="border-t border-line px-2 pt-1.5 pb-1 text-caption text-ink-3">
            Each .xlsx starts with a sheet naming the models behind the results: estimates, not measurements.
          </p>
        </div>
      )}
    </div>
  );
}
