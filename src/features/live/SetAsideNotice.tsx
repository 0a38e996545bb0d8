// My inputs that lost a conflict (or whose tab a colleague deleted), kept in this browser until I
// dismiss them: each with its cell, what replaced it and a copy button.
import { useState } from 'react';
import { Button } from '../../components/ui/Button.js';
import { cellAddress } from '../../../shared/a1.js';
import { describeInput, type SetAsideInput } from './conflictResolution.js';

export function SetAsideNotice({ inputs, sheetName, onDismiss }: { inputs: SetAsideInput[]; sheetName: (sheetId: string) => string; onDismiss: () => void }) {
  const [open, setOpen] = useState(false);
  const [copied, setCopied] = useState<number | null>(null);
  if (inputs.length === 0) return null;
  const copy = (i: number, text: string) =>
    void navigator.clipboard?.writeText(text).then(
      () => setCopied(i),
      () => setCopied(null),
    );
  return (
    <section aria-label="Inputs set aside" data-grid-shield="" className="shrink-0 border-b border-line bg-raised px-3 py-1 text-caption text-ink-2">
      <div className="flex items-center gap-2">
        <span>
          {inputs.length === 1 ? '1 input of yours was' : `${inputs.length} inputs of yours were`} set aside (kept in this browser, not saved).
        </span>
        <button type="button" className="font-medium text-accent hover:underline" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
          {open ? 'Hide' : 'Show'}
        </button>
        <button type="button" className="ml-auto text-ink-3 hover:text-ink" onClick={onDismiss}>
          Forget them
        </button>
      </div>
      {open && (
        <ul className="mt-1 mb-0.5 flex max-h-40 flex-col gap-0.5 overflow-y-auto">
          {inputs.map((c, i) => (
            <li key={`${c.sheetId}-${c.row}-${c.col}-${c.at}-${i}`} className="flex items-center gap-2">
              <span className="w-28 shrink-0 font-mono font-semibold text-ink">{cellAddress(sheetName(c.sheetId), c.row, c.col)}</span>
              <code className="min-w-0 flex-1 truncate text-ink" title={c.input}>
                {describeInput(c.input)}
              </code>
              <span className="shrink-0 text-ink-3">replaced by {describeInput(c.replacedBy)}</span>
              <Button variant="ghost" className="h-6" onClick={() => copy(i, c.input)}>
                {copied === i ? 'Copied' : 'Copy'}
              </Button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
