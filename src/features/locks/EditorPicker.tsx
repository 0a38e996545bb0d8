// Who besides the person setting a lock or range may still edit behind it: the workbook's owner and
// editors (a viewer can edit nothing anyway, and the server refuses them on a list).
import type { Member } from '@shared/team.js';

export function EditorPicker({ members, myId, selected, onChange, legend }: { members: Member[]; myId: string; selected: string[]; onChange: (ids: string[]) => void; legend: string }) {
  const candidates = members.filter((m) => m.user.id !== myId && m.role !== 'viewer');
  const toggle = (id: string, on: boolean) => onChange(on ? [...selected, id] : selected.filter((x) => x !== id));
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-caption font-medium text-ink-2">{legend}</legend>
      <p className="text-caption text-ink-3">You can always edit what you protect.</p>
      {candidates.length === 0 ? (
        <p className="text-caption text-ink-3">No other owner or editor to add.</p>
      ) : (
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {candidates.map((m) => (
            <label key={m.user.id} className="flex items-center gap-1.5 text-ui text-ink">
              <input type="checkbox" checked={selected.includes(m.user.id)} onChange={(e) => toggle(m.user.id, e.target.checked)} className="accent-[var(--color-accent)]" />
              {m.user.name}
            </label>
          ))}
        </div>
      )}
    </fieldset>
  );
}
