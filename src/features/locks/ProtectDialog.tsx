// The "Protect" dialog of one sheet: its lock and its protected ranges.
import { useState } from 'react';
import { sheetManageRefusal, type AccessRole, type WorkbookAction } from '@shared/permissions.js';
import { sheetStanding, type Protection, type SheetActor } from '@shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { Dialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useMembers } from '../../core/team/members.js';
import { ProtectedRangesSection } from './ProtectedRangesSection.js';
import { SheetLockSection } from './SheetLockSection.js';

export function ProtectDialog({
  open,
  onClose,
  workbookId,
  sheet,
  protection,
  role,
  me,
  myId,
  suggestedRange,
}: {
  open: boolean;
  onClose: () => void;
  workbookId: string;
  sheet: { id: string; name: string; createdBy?: string | null };
  protection: Protection;
  actions: WorkbookAction[];
  role: AccessRole;
  me: SheetActor;
  myId: string;
  suggestedRange?: string;
}) {
  const members = useMembers(workbookId, open);
  // The selection as the dialog opened: clicks inside the dialog may clear the grid's selection, and
  // the range field must not empty itself when they do.
  const [openedWith, setOpenedWith] = useState<{ open: boolean; range?: string }>({ open: false });
  if (openedWith.open !== open) setOpenedWith({ open, range: open ? suggestedRange : undefined });
  const startRange = open === openedWith.open ? openedWith.range : suggestedRange;
  // Owners on any sheet, editors on sheets they created and still edit (the rule the server refuses
  // with): a control that would be refused is disabled and says why.
  const lock = protection.locks.find((l) => l.sheetId === sheet.id);
  const myRole = sheetStanding(protection, me, sheet.id).role;
  const roles: AccessRole[] = [role];
  const lockRefusal = sheetManageRefusal(roles, myId, sheet, { myRoleOnSheet: myRole });
  const unlockRefusal = lock ? sheetManageRefusal(roles, myId, sheet, { setBy: lock.lockedBy.id, myRoleOnSheet: myRole }) : null;
  const canLock = lockRefusal === null;
  const ranges = protection.protectedRanges.filter((r) => r.sheetId === sheet.id);
  return (
    <Dialog open={open} onClose={onClose} title={`Protect “${sheet.name}”`} width="w-[34rem]" footer={<Button onClick={onClose}>Done</Button>}>
      {members.isError ? (
        <Notice tone="error">{sentence(members.error.message)}</Notice>
      ) : (
        <div className="max-h-[min(36rem,calc(100vh-10rem))] overflow-y-auto">
          <SheetLockSection workbookId={workbookId} sheetId={sheet.id} lock={lock} members={members.data ?? []} myId={myId} lockRefusal={lockRefusal} unlockRefusal={unlockRefusal} />
          <ProtectedRangesSection
            workbookId={workbookId}
            sheetId={sheet.id}
            ranges={ranges}
            members={members.data ?? []}
            myId={myId}
            canProtect={canLock}
            suggestedRange={startRange}
          />
        </div>
      )}
    </Dialog>
  );
}
