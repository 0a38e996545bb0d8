// Where the save queue stands, in words that are true at every moment: "Saved" only when the
// server has acknowledged every change.
import type { SaveStatus } from '../../../core/workbook/save/patchQueue.js';
import { plural } from '@shared/plural.js';


function saveLabel(s: SaveStatus): string {
  switch (s.kind) {
    case 'saved':
      return 'Saved';
    case 'saving':
      return 'Saving…';
    case 'offline':
      return `Offline — ${plural(s.waiting, 'change')} waiting`;
    case 'conflict':
      return 'Conflict';
    case 'refused':
      return `Not saved — ${plural(s.waiting, 'change')} kept here`;
  }
}

const tone: Record<SaveStatus['kind'], string> = {
  saved: 'text-ok',
  saving: 'text-ink-2',
  offline: 'text-caution',
  conflict: 'text-danger',
  refused: 'text-danger',
};

export function SaveIndicator({ status, storageWorks }: { status: SaveStatus; storageWorks: boolean }) {
  const detail = status.kind === 'offline' ? `Retrying: ${status.reason}` : status.kind === 'refused' ? status.message : undefined;
  return (
    <span className="flex items-center gap-2 text-caption">
      <span role="status" aria-live="polite" data-testid="save-state" data-state={status.kind} title={detail} className={`flex items-center gap-1.5 font-medium ${tone[status.kind]}`}>
        <span aria-hidden="true" className="size-2 rounded-full bg-current" />
        {saveLabel(status)}
      </span>
      {!storageWorks && <span className="text-caution">This browser is not keeping unsent changes: stay online until saved.</span>}
    </span>
  );
}
