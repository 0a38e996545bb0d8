// Locking one sheet: while locked everyone is a viewer of it except the people named on the lock
// (they become its editors, as sheet roles); everyone sees who locked it, when and why. Controls the
// user may not use are disabled with the reason.
import { useState, type FormEvent } from 'react';
import { sheetLockSchema, type Member, type SheetLock } from '@shared/team.js';
import { Button } from '../../components/ui/Button.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useLockSheet, useUnlockSheet } from './api.js';
import { EditorPicker } from './EditorPicker.js';

const when = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Who locked the sheet, when and why, and who may still edit it; said to `myId` when given. */
export function lockSummary(lock: SheetLock, myId?: string): string {
  const head = `Locked by ${lock.lockedBy.name} on ${when.format(new Date(lock.createdAt))}: “${lock.reason}”.`;
  const names = lock.editors.map((e) => e.name);
  if (myId === undefined) return `${head} Only ${names.join(', ')} may change it.`;
  const others = lock.editors.filter((e) => e.id !== myId).map((e) => e.name);
  if (others.length === lock.editors.length) return `${head} Only ${names.join(', ')} may change it; it is read-only for you.`;
  return others.length === 0 ? `${head} You alone may still edit it.` : `${head} You and ${others.join(', ')} may still edit it.`;
}

export function SheetLockSection({
  workbookId,
  sheetId,
  lock,
  members,
  myId,
  lockRefusal,
  unlockRefusal,
}: {
  workbookId: string;
  sheetId: string;
  lock: SheetLock | undefined;
  members: Member[];
  myId: string;
  lockRefusal: string | null;
  unlockRefusal: string | null;
}) {
  const canLock = lockRefusal === null;
  const lockSheet = useLockSheet(workbookId);
  const unlock = useUnlockSheet(workbookId);
  const [editors, setEditors] = useState<string[]>([]);
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const checked = checkForm(sheetLockSchema, { reason: new FormData(event.currentTarget).get('reason'), editors });
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    lockSheet.mutate({ sheetId, ...checked.data }, { onError: (e) => setErrors(errorsFromApi(e, ['reason', 'editors'])) });
  }

  return (
    <section aria-labelledby="lock-heading">
      <h3 id="lock-heading" className="mb-1.5 text-caption font-semibold tracking-wide text-ink-3 uppercase">
        Sheet lock
      </h3>
      {lock ? (
        <div className="flex items-start gap-3 rounded-ctl border border-caution-line bg-caution-soft px-3 py-2 text-ink">
          <p className="flex-1">{lockSummary(lock)}</p>
          <span title={unlockRefusal ? sentence(unlockRefusal) : undefined}>
            <Button busy={unlock.isPending} disabled={unlockRefusal !== null} onClick={() => unlock.mutate(sheetId)}>
              Unlock
            </Button>
          </span>
        </div>
      ) : canLock ? (
        <form noValidate onSubmit={submit} className="flex flex-col gap-2.5">
          <TextField label="Why lock it?" name="reason" maxLength={500} hint="Everyone sees it, for example: values checked against the reference tables." error={errors.fields.reason} />
          <EditorPicker legend="Who else may still change it" members={members} myId={myId} selected={editors} onChange={setEditors} viewersToo />
          {errors.form && (
            <p role="alert" className="text-caption text-danger">
              {errors.form}
            </p>
          )}
          <div>
            <Button type="submit" variant="primary" busy={lockSheet.isPending}>
              Lock sheet
            </Button>
          </div>
        </form>
      ) : (
        <p className="text-ink-3">Not locked. You cannot lock it: {lockRefusal}.</p>
      )}
      {unlock.isError && (
        <p role="alert" className="mt-1.5 text-caption text-danger">
          {sentence(unlock.error.message)}
        </p>
      )}
    </section>
  );
}
