import { useState, type FormEvent } from 'react';
import { passwordMinLength, passwordProblem } from '../../../shared/auth.js';
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useMe } from '../../core/session/me.js';
import { useChangePassword, useResendVerification } from './accountApi.js';

/** "Your account": whether the address is confirmed (with a new link on request) and a password change. */
export function AccountPage() {
  const user = useMe().data;
  const change = useChangePassword();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const data = new FormData(form);
    const current = String(data.get('current') ?? '');
    const next = String(data.get('next') ?? '');
    const fields: Record<string, string> = {};
    if (!current) fields.current = 'Required.';
    const problem = passwordProblem(next, user?.email);
    if (problem) fields.next = sentence(problem);
    if (Object.keys(fields).length) return setErrors({ fields });
    setErrors({ fields: {} });
    change.mutate({ current, next }, { onSuccess: () => form.reset(), onError: (error) => setErrors(errorsFromApi(error, ['current', 'next'])) });
  }

  if (!user) return null;
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6 px-4 py-8">
      <title>Your account · Orbitab</title>
      <h1 className="text-title font-semibold">Your account</h1>
      <section aria-labelledby="address-title" className="flex flex-col gap-2">
        <h2 id="address-title" className="font-medium">
          E-mail address
        </h2>
        <p className="text-ui">{user.email}</p>
        {user.emailVerified ? <p className="text-caption text-ok">Confirmed.</p> : <ConfirmAddress email={user.email} />}
      </section>
      <section aria-labelledby="password-title" className="flex flex-col gap-3">
        <h2 id="password-title" className="font-medium">
          Change password
        </h2>
        <form noValidate onSubmit={submit} className="flex flex-col gap-3">
          {errors.form && <Notice tone="error">{errors.form}</Notice>}
          {change.isSuccess && <Notice tone="success">Password changed. Every other session of your account has been signed out.</Notice>}
          <TextField label="Current password" name="current" type="password" autoComplete="current-password" required error={errors.fields.current} />
          <TextField label="New password" name="next" type="password" autoComplete="new-password" required hint={`At least ${passwordMinLength} characters.`} error={errors.fields.next} />
          <Button type="submit" variant="primary" busy={change.isPending} className="h-8 self-start">
            {change.isPending ? 'Saving…' : 'Change password'}
          </Button>
        </form>
      </section>
    </div>
  );
}

/** Not yet confirmed: what that means, and a new link on request. */
export function ConfirmAddress({ email }: { email: string }) {
  const resend = useResendVerification();
  return (
    <Notice tone="caution" title="Address not confirmed yet">
      Open the link we e-mailed to {email}. Until then nobody can share a workbook with you.{' '}
      {resend.isSuccess ? (
        <span>{sentence(resend.data.message)}</span>
      ) : (
        <Button variant="secondary" busy={resend.isPending} onClick={() => resend.mutate()} className="mt-1 h-7">
          Send the link again
        </Button>
      )}
      {resend.isError && <span className="block text-danger">{sentence(resend.error.message)}</span>}
    </Notice>
  );
}
