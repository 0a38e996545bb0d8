// Who besides the person setting a lock or range may still edit behind it. A lock's names become
// editors of that sheet (sheet roles), workbook viewers included; a range lists the workbook's owner
// and editors (a viewer edits a range only on a sheet that names them editor).
import type { Member } from '@shared/team.js';

export function EditorPicker({
  members,
  myId,
  selected,
  onChange,
  legend,
  viewersToo = false,
}: {
  members: Member[];
  myId: string;
  selected: string[];
  onChange: (ids: string[]) => void;
  legend: string;
  /** Offer workbook viewers as well (a lock makes those it names editors of the sheet). */
  viewersToo?: boolean;
}) {
  const candidates = members.filter((m) => m.user.id !== myId && (viewersToo || m.role !== 'viewer'));
  const toggle = (id: string, on: boolean) => onChange(on ? [...selected, id] : selected.filter((x) => x !== id));
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-caption font-medium text-ink-2">{legend}</legend>
      <p className="text-caption text-ink-3">You can always edit what you protect.</p>
      {candidates.length === 0 ? (
        <p className="text-caption text-ink-3">No one else to add.</p>
      ) : (
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {candidates.map((m) => (
            <label key={m.user.id} className="flex items-center gap-1.5 text-ui text-ink">
              <input type="checkbox" checked={selected.includes(m.user.id)} onChange={(e) => toggle(m.user.id, e.target.checked)} className="accent-[var(--color-accent)]" />
              {m.user.name}
              {m.role === 'viewer' && <span className="text-caption text-ink-3">(workbook viewer)</span>}
            </label>
          ))}
        </div>
      )}
    </fieldset>
  );
}
