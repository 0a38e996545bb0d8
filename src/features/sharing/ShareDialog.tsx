// Sharing a workbook: add a colleague by e-mail (an account joins at once, anyone else is invited by
// e-mail), then see who has access and what is still pending. The API decides every step (403 with
// its reason); the dialog only hides what the caller's role could never do.
import { useId, useState, type FormEvent } from 'react';
import { addMemberSchema, grantableRoles, type AddMemberResponse, type GrantableRole } from '../../../shared/team.js';
import { allows, roleLabels, type WorkbookAction } from '../../../shared/permissions.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useMembers } from '../../core/team/members.js';
import { useAddMember, useInvitations } from './api.js';
import { InvitationList } from './InvitationList.js';
import { MemberList } from './MemberList.js';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

function addedMessage(result: AddMemberResponse): string {
  if ('member' in result) return `${result.member.user.name} now has access as ${roleLabels[result.member.role].toLowerCase()}.`;
  return `No account uses ${result.invitation.email} yet, so an invitation was e-mailed. It works once and expires on ${dateFormat.format(new Date(result.invitation.expiresAt))}.`;
}

export function ShareDialog({
  open,
  onClose,
  workbookId,
  title,
  actions,
  myId,
  onLeft,
}: {
  open: boolean;
  onClose: () => void;
  workbookId: string;
  title: string;
  actions: WorkbookAction[];
  myId: string;
  /** I removed myself: the workbook is no longer mine to look at. */
  onLeft: () => void;
}) {
  const canManage = allows(actions, 'manageMembers');
  const members = useMembers(workbookId, open);
  const invitations = useInvitations(workbookId, open && canManage);
  const add = useAddMember(workbookId);
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });
  const [added, setAdded] = useState<string | null>(null);
  const [grant, setGrant] = useState<GrantableRole>('editor');
  const roleId = useId();

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

  return (
    <Dialog open={open} onClose={onClose} title={`Share “${title}”`} width="w-[36rem]" footer={<Button onClick={onClose}>Done</Button>}>
      {canManage ? (
        <form noValidate onSubmit={submit} className="mb-3 flex flex-col gap-1.5">
          <div className="flex items-end gap-2">
            <TextField label="Add people by e-mail" name="email" type="email" autoComplete="off" placeholder="colleague@lab.example" error={errors.fields.email} className="flex-1" />
            <div className="flex flex-col gap-1">
              <label htmlFor={roleId} className="text-caption font-medium text-ink-2">
                Role
              </label>
              <select
                id={roleId}
                value={grant}
                onChange={(e) => setGrant(e.target.value as GrantableRole)}
                className="h-8 rounded-ctl border border-line-strong bg-surface px-1.5 text-ui text-ink"
              >
                {grantableRoles.map((r) => (
                  <option key={r} value={r}>
                    {roleLabels[r]}
                  </option>
                ))}
              </select>
            </div>
            <Button type="submit" variant="primary" busy={add.isPending} className="h-8">
              Share
            </Button>
          </div>
          {!errors.fields.email && <p className="text-caption text-ink-3">Editors change cells and sheets not locked to them; viewers read and export.</p>}
          {errors.form && <Notice tone="error">{errors.form}</Notice>}
          {added && <Notice tone="success">{added}</Notice>}
        </form>
      ) : (
        <p className="mb-3 text-caption text-ink-3">Only the owner can share this workbook or change roles.</p>
      )}
      <div className="max-h-[22rem] overflow-y-auto">
        {members.isPending ? (
          <p role="status" className="py-2 text-ink-3">
            Loading members…
          </p>
        ) : members.isError ? (
          <Notice tone="error">{sentence(members.error.message)}</Notice>
        ) : (
          <MemberList workbookId={workbookId} members={members.data} myId={myId} canManage={canManage} onLeft={onLeft} />
        )}
        {canManage && invitations.data && <InvitationList workbookId={workbookId} invitations={invitations.data} />}
      </div>
    </Dialog>
  );
}
