// The empty state of a workbook: while every sheet is empty and the user may edit, a bar above the
// grid offers the starter templates (starterTemplates.ts), so nobody starts from a blank grid.
// Choosing one types it into the active sheet as ordinary edits (saved, undoable).
import { useState } from 'react';
import { Button } from '../../components/ui/Button.js';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import { starterTemplates, templateChanges } from './starterTemplates.js';

export function StarterTemplate({ model, sheetId }: { model: WorkbookModel; sheetId: string }) {
  const [dismissed, setDismissed] = useState(false);
  const empty = model.sheets.every((s) => s.inputs.size === 0);
  if (dismissed || !empty || model.readOnly) return null;
  return (
    <section aria-label="Start from a template" data-grid-shield="" data-testid="starter-templates" className="flex shrink-0 flex-wrap items-start gap-x-6 gap-y-2 border-b border-line bg-raised px-3 py-2 text-caption text-ink-2">
      <p className="w-full font-medium text-ink">This workbook is empty. Start from a template, or type into the grid.</p>
      {starterTemplates.map((t) => (
        <div key={t.id} className="flex max-w-sm flex-col gap-1">
          <Button variant="primary" className="self-start" onClick={() => model.edit(templateChanges(t, sheetId))}>
            {t.label}
          </Button>
          <span>{t.description}</span>
        </div>
      ))}
      <Button variant="ghost" className="self-start" onClick={() => setDismissed(true)}>
        Start blank
      </Button>
    </section>
  );
}
