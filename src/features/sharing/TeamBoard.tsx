// The team board: members down the side, sheets across the top, and in each cell the member's role
// on that sheet — edits or views, and why (set on the sheet, a lock, or the workbook role). Cells
// are changed in place by those allowed (shared/permissions.ts sheetManageRefusal); a cell they may
// not change says why on hover. Each member's row also holds their workbook role, where they are now,
// and the steps an owner takes (hand over, remove); pending invitations close the table.
import type { AccessRole, SheetRole, WorkbookRole } from '@shared/permissions.js';
import { roleLabels, sheetManageRefusal } from '@shared/permissions.js';
import { cellName } from '@shared/a1.js';
import { sheetStanding, type Invitation, type Member, type PresenceUser, type Protection, type SheetStanding } from '@shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { memberColour } from './memberColour.js';


export interface BoardSheet {
  id: string;
  name: string;
  createdBy?: string | null;
}

export type RowStep = { kind: 'handOver' | 'remove'; member: Member };

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });
const word: Record<SheetRole, string> = { editor: 'Edits', viewer: 'Views' };
const why = (s: SheetStanding) => (s.source === 'override' ? 'set here' : s.source === 'lock' ? 'locked' : 'workbook role');

function RoleCell({ member, sheet, standing, refusal, busy, onChange }: { member: Member; sheet: BoardSheet; standing: SheetStanding; refusal: string | null; busy: boolean; onChange: (role: SheetRole | null) => void }) {
  const tone =
    standing.role === 'editor' ? 'border-ok/40 bg-ok-soft text-ok' : standing.source === 'lock' ? 'border-caution-line bg-caution-soft text-caution' : 'border-line bg-sunken text-ink-3';
  const marked = standing.source === 'override' ? 'border-dashed border-accent' : '';
  const label = `${member.user.name} on ${sheet.name}`;
  const detail =
    standing.source === 'override' && standing.override
      ? `${word[standing.role]} — set on this sheet by ${standing.override.setBy.name}${standing.override.viaLock ? ' with its lock' : ''}`
      : standing.source === 'lock' && standing.lock
        ? `${word[standing.role]} — ${standing.lock.lockedBy.name} locked this sheet: “${standing.lock.reason}”`
        : `${word[standing.role]} — as their workbook role says`;
  const pill = `inline-flex h-6 w-full items-center justify-center gap-1 rounded-full border px-2 text-caption font-medium ${tone} ${marked}`;
  if (refusal) {
    return (
      <span role="img" aria-label={`${label}: ${detail}`} title={`${detail}\nYou cannot change it: ${refusal}`} className={pill}>
        {word[standing.role]}
        <span className="font-normal opacity-80">· {why(standing)}</span>
      </span>
    );
  }
  const value = standing.source === 'override' ? standing.role : '';
  const fallback = sheetStanding({ locks: standing.lock ? [standing.lock] : [], sheetRoles: [], protectedRanges: [] }, { id: member.user.id, role: member.role }, sheet.id);
  return (
    <select
      aria-label={label}
      title={detail}
      disabled={busy}
      value={value}
      onChange={(e) => onChange(e.target.value === '' ? null : (e.target.value as SheetRole))}
      className={`${pill} cursor-pointer appearance-none text-center hover:brightness-95`}
    >
      <option value="">
        {word[fallback.role]} · {why(fallback)}
      </option>
      <option value="editor">Edits · set here</option>
      <option value="viewer">Views · set here</option>
    </select>
  );
}

export function TeamBoard(p: {
  sheets: BoardSheet[];
  members: Member[];
  invitations: Invitation[];
  protection: Protection;
  presence: PresenceUser[];
  myId: string;
  myRoles: AccessRole[];
  canManage: boolean;
  busyCell: string | null;
  busyMember: string | null;
  onSheetRole: (member: Member, sheet: BoardSheet, role: SheetRole | null) => void;
  onWorkbookRole: (member: Member, role: WorkbookRole) => void;
  onStep: (step: RowStep) => void;
  onWithdraw: (invitation: Invitation) => void;
}) {
  const me = p.members.find((m) => m.user.id === p.myId);
  // Colours by place on the board, so no two rows share one.
  const colourOf = (userId: string) => memberColour(Math.max(0, p.members.findIndex((m) => m.user.id === userId)));
  const here = new Map(p.presence.map((u) => [u.userId, u]));
  const sheetName = (id: string) => p.sheets.find((s) => s.id === id)?.name;
  return (
    <div className="overflow-auto rounded-ctl border border-line">
      <table className="w-full border-collapse text-ui" aria-label="Team board">
        <thead className="bg-raised text-caption text-ink-3">
          <tr>
            <th scope="col" className="sticky left-0 z-10 bg-raised px-3 py-1.5 text-left font-semibold">
              Member
            </th>
            <th scope="col" className="px-2 py-1.5 text-left font-semibold">
              Workbook
            </th>
            {p.sheets.map((s) => {
              const count = p.presence.filter((u) => u.userId !== p.myId && u.cell?.sheetId === s.id).length;
              return (
                <th key={s.id} scope="col" className="min-w-28 px-2 py-1.5 text-center font-semibold">
                  <span className="font-mono text-ink-2">{s.name}</span>
                  {count > 0 && <span className="font-normal text-accent">{` · ${count} here`}</span>}
                </th>
              );
            })}
            <th scope="col" className="px-2 py-1.5 text-left font-semibold">
              Now at
            </th>
            <th scope="col" className="px-2 py-1.5">
              <span className="sr-only">Steps</span>
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {p.members.map((m) => {
            const mine = m.user.id === p.myId;
            const at = here.get(m.user.id);
            const atSheet = at?.cell ? sheetName(at.cell.sheetId) : undefined;
            return (
              <tr key={m.user.id} aria-label={m.user.name} aria-busy={p.busyMember === m.user.id || undefined} className="hover:bg-hover/40">
                <th scope="row" className="sticky left-0 z-10 bg-surface px-3 py-1.5 text-left font-normal">
                  <span className="flex items-center gap-2">
                    <span aria-hidden="true" className="size-2.5 shrink-0 rounded-full" style={{ background: colourOf(m.user.id) }} />
                    <span className="min-w-0">
                      <span className="block truncate font-medium text-ink">
                        {m.user.name}
                        {mine && <span className="ml-1 text-caption font-normal text-ink-3">(you)</span>}
                      </span>
                      <span className="block truncate text-caption text-ink-3">{m.user.email}</span>
                    </span>
                  </span>
                </th>
                <td className="px-2 py-1.5">
                  {p.canManage && m.role !== 'owner' ? (
                    <select
                      aria-label={`Workbook role of ${m.user.name}`}
                      value={m.role}
                      disabled={p.busyMember === m.user.id}
                      onChange={(e) => p.onWorkbookRole(m, e.target.value as WorkbookRole)}
                      className="h-7 rounded-ctl border border-line-strong bg-surface px-1.5 text-ui text-ink"
                    >
                      <option value="editor">{roleLabels.editor}</option>
                      <option value="viewer">{roleLabels.viewer}</option>
                    </select>
                  ) : (
                    <span className={m.role === 'owner' ? 'font-semibold text-accent' : 'text-ink-2'}>{roleLabels[m.role]}</span>
                  )}
                </td>
                {p.sheets.map((s) => {
                  const standing = sheetStanding(p.protection, { id: m.user.id, role: m.role }, s.id);
                  const myStanding = me ? sheetStanding(p.protection, { id: me.user.id, role: me.role }, s.id) : undefined;
                  const refusal =
                    sheetManageRefusal(p.myRoles, p.myId, s, { setBy: standing.override?.setBy.id, myRoleOnSheet: myStanding?.role }) ??
                    (m.role === 'owner' && !p.myRoles.includes('owner') ? 'only an owner may change an owner’s role on a sheet' : null);
                  const isHere = at?.cell?.sheetId === s.id && !mine;
                  return (
                    <td key={s.id} className="relative px-2 py-1.5 text-center">
                      <RoleCell member={m} sheet={s} standing={standing} refusal={refusal} busy={p.busyCell === `${m.user.id}:${s.id}`} onChange={(role) => p.onSheetRole(m, s, role)} />
                      {isHere && (
                        <span
                          aria-hidden="true"
                          title={`${m.user.name} is here`}
                          className="absolute top-1 right-1.5 size-2 rounded-full ring-2 ring-surface"
                          style={{ background: colourOf(m.user.id) }}
                        />
                      )}
                    </td>
                  );
                })}
                <td className="px-2 py-1.5 text-caption whitespace-nowrap" data-testid={`now-at-${m.user.id}`}>
                  {mine ? (
                    <span className="text-ink-3">this page</span>
                  ) : at ? (
                    <span className="font-mono" style={{ color: colourOf(m.user.id) }}>
                      {atSheet && at.cell ? `${atSheet}!${cellName(at.cell.row, at.cell.col)}` : 'open'}
                    </span>
                  ) : (
                    <span className="text-ink-3">away</span>
                  )}
                </td>
                <td className="px-2 py-1.5 text-right whitespace-nowrap">
                  {p.canManage && m.role !== 'owner' && (
                    <>
                      <Button variant="ghost" onClick={() => p.onStep({ kind: 'handOver', member: m })} aria-label={`Hand the workbook to ${m.user.name}`}>
                        Hand over
                      </Button>
                      <Button variant="ghost" className="hover:text-danger" onClick={() => p.onStep({ kind: 'remove', member: m })} aria-label={`Remove ${m.user.name}`}>
                        Remove
                      </Button>
                    </>
                  )}
                  {!p.canManage && mine && m.role !== 'owner' && (
                    <Button variant="ghost" className="hover:text-danger" onClick={() => p.onStep({ kind: 'remove', member: m })}>
                      Leave
                    </Button>
                  )}
                </td>
              </tr>
            );
          })}
          {p.invitations.map((inv) => (
            <tr key={inv.id} aria-label={`Invitation to ${inv.email}`} className="bg-raised/60">
              <th scope="row" className="sticky left-0 z-10 bg-raised px-3 py-1.5 text-left font-normal">
                <span className="flex items-center gap-2">
                  <span aria-hidden="true" className="size-2.5 shrink-0 rounded-full border border-dashed border-ink-3" />
                  <span className="truncate text-ink-2 italic">{inv.email}</span>
                </span>
              </th>
              <td className="px-2 py-1.5 text-ink-2">{roleLabels[inv.role]}</td>
              <td colSpan={p.sheets.length + 1} className="px-2 py-1.5 text-caption text-ink-3">
                Invited by {inv.invitedBy.name}; the link works until {dateFormat.format(new Date(inv.expiresAt))}. Sheets follow the workbook role once they join.
              </td>
              <td className="px-2 py-1.5 text-right">
                <Button variant="ghost" className="hover:text-danger" onClick={() => p.onWithdraw(inv)} aria-label={`Withdraw the invitation to ${inv.email}`}>
                  Withdraw
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
