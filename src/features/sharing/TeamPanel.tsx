// The team panel of a workbook: bring someone in by e-mail (an account joins at once, anyone else is
// invited), and the team board — who may edit which sheet, who is where now, pending invitations —
// with handing the workbook over and removing people as steps of each row. The API decides every
// step (403 with its reason); the panel disables what the caller could never do and says why.
import { useId, useState, type FormEvent } from 'react';
import { addMemberSchema, grantableRoles, type AddMemberResponse, type GrantableRole, type PresenceUser, type Protection } from '@shared/team.js';
import { allows, roleLabels, type AccessRole, type WorkbookAction } from '@shared/permissions.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useMembers } from '../../core/team/members.js';
import { useAddMember, useChangeMemberRole, useInvitations, useRemoveMember, useRevokeInvitation, useSetSheetRole } from './api.js';
import { TeamBoard, type BoardSheet, type RowStep } from './TeamBoard.js';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

function addedMessage(result: AddMemberResponse): string {
  if ('member' in result) return `${result.member.user.name} joined as ${roleLabels[result.member.role].toLowerCase()}; their row is on the board below.`;
  return `No account uses ${result.invitation.email} yet, so an invitation was e-mailed. It works once, until ${dateFormat.format(new Date(result.invitation.expiresAt))}.`;
}

export function TeamPanel(p: {
  open: boolean;
  onClose: () => void;
  workbookId: string;
  title: string;
  role: AccessRole;
  actions: WorkbookAction[];
  myId: string;
  sheets: BoardSheet[];
  protection: Protection;
  presence: PresenceUser[];
  /** I removed myself: the workbook is no longer mine to look at. */
  onLeft: () => void;
}) {
  const canManage = allows(p.actions, 'manageMembers');
  const members = useMembers(p.workbookId, p.open);
  const invitations = useInvitations(p.workbookId, p.open && canManage);
  const add = useAddMember(p.workbookId);
  const changeRole = useChangeMemberRole(p.workbookId);
  const remove = useRemoveMember(p.workbookId);
  const withdraw = useRevokeInvitation(p.workbookId);
  const setSheetRole = useSetSheetRole(p.workbookId);
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });
  const [added, setAdded] = useState<string | null>(null);
  const [grant, setGrant] = useState<GrantableRole>('editor');
  const [step, setStep] = useState<RowStep | null>(null);
  const roleId = useId();
  const failure = setSheetRole.error ?? changeRole.error ?? remove.error ?? withdraw.error;

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const checked = checkForm(addMemberSchema, { email: new FormData(form).get('email'), role: grant });
    setAdded(null);
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    add.mutate(checked.data, {
      onSuccess: (result) => {
        setAdded(addedMessage(result));
        form.reset();
      },
      onError: (e) => setErrors(errorsFromApi(e, ['email', 'role'])),
    });
  }

  const confirm = () => {
    if (!step) return;
    const { member } = step;
    if (step.kind === 'handOver') changeRole.mutate({ userId: member.user.id, role: 'owner' }, { onSuccess: () => setStep(null) });
    else remove.mutate(member.user.id, { onSuccess: () => (setStep(null), member.user.id === p.myId && p.onLeft()) });
  };
  const mine = step?.member.user.id === p.myId;

  return (
    <Dialog open={p.open} onClose={p.onClose} title={`Team · ${p.title}`} width="w-[min(64rem,calc(100vw-2rem))]" footer={<Button onClick={p.onClose}>Close</Button>}>
      {canManage ? (
        <form noValidate onSubmit={submit} className="mb-3 flex flex-col gap-1.5">
          <div className="flex items-end gap-2">
            <TextField label="Bring someone in (e-mail)" name="email" type="email" autoComplete="off" placeholder="colleague@lab.example" error={errors.fields.email} className="flex-1" />
            <div className="flex flex-col gap-1">
              <label htmlFor={roleId} className="text-caption font-medium text-ink-2">
                Workbook role
              </label>
              <select id={roleId} value={grant} onChange={(e) => setGrant(e.target.value as GrantableRole)} className="h-8 rounded-ctl border border-line-strong bg-surface px-1.5 text-ui text-ink">
                {grantableRoles.map((r) => (
                  <option key={r} value={r}>
                    {roleLabels[r]}
                  </option>
                ))}
              </select>
            </div>
            <Button type="submit" variant="primary" busy={add.isPending} className="h-8">
              Add to team
            </Button>
          </div>
          {errors.form && <Notice tone="error">{errors.form}</Notice>}
          {added && <Notice tone="success">{added}</Notice>}
        </form>
      ) : (
        <p className="mb-3 text-caption text-ink-3">The owner brings people in and sets workbook roles; owners, and editors on sheets they created, set who edits each sheet.</p>
      )}
      {failure && (
        <p role="alert" className="mb-2 text-caption text-danger">
          {sentence(failure.message)}
        </p>
      )}
      {step && (
        <div role="group" aria-label="Confirm" className="mb-2 flex items-center gap-2 rounded-ctl border border-caution-line bg-caution-soft px-3 py-2 text-ink">
          <p className="flex-1 text-caption">
            {step.kind === 'handOver'
              ? `Hand “${p.title}” to ${step.member.user.name}? They become its owner; you stay on the team as an editor.`
              : mine
                ? 'Leave this workbook? You lose access until an owner brings you in again.'
                : `Remove ${step.member.user.name}? They lose access at once, with every role they had on its sheets and ranges.`}
          </p>
          <Button onClick={() => setStep(null)}>Cancel</Button>
          <Button variant={step.kind === 'handOver' ? 'primary' : 'danger'} busy={changeRole.isPending || remove.isPending} onClick={confirm}>
            {step.kind === 'handOver' ? 'Hand over' : mine ? 'Leave' : 'Remove'}
          </Button>
        </div>
      )}
      <div className="max-h-[min(30rem,calc(100vh-16rem))] overflow-auto">
        {members.isPending ? (
          <p role="status" className="py-2 text-ink-3">
            Loading the team…
          </p>
        ) : members.isError ? (
          <Notice tone="error">{sentence(members.error.message)}</Notice>
        ) : (
          <TeamBoard
            sheets={p.sheets}
            members={members.data}
            invitations={canManage ? (invitations.data ?? []) : []}
            protection={p.protection}
            presence={p.presence}
            myId={p.myId}
            myRoles={p.role === 'site-admin' ? ['site-admin'] : [p.role]}
            canManage={canManage}
            busyCell={setSheetRole.isPending && setSheetRole.variables ? `${members.data.find((m) => m.user.email === setSheetRole.variables.email)?.user.id}:${setSheetRole.variables.sheetId}` : null}
            busyMember={changeRole.isPending ? (changeRole.variables?.userId ?? null) : remove.isPending ? (remove.variables ?? null) : null}
            onSheetRole={(member, sheet, role) => setSheetRole.mutate({ sheetId: sheet.id, email: member.user.email, role })}
            onWorkbookRole={(member, role) => changeRole.mutate({ userId: member.user.id, role })}
            onStep={setStep}
            onWithdraw={(inv) => withdraw.mutate(inv.id)}
          />
        )}
      </div>
      <p className="mt-2 text-caption text-ink-3">
        <span className="font-medium text-ok">Edits</span> or <span className="font-medium">Views</span>, and why: <em>set here</em> — chosen for that sheet; <em>locked</em> — the sheet is locked; <em>workbook role</em> — nothing set on the sheet. A
        dot marks the sheet someone is on now.
      </p>
    </Dialog>
  );
}
