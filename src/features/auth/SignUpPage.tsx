import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { passwordMinLength, signUpSchema } from '../../../shared/auth.js';
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, type FormErrors } from '../../lib/fieldErrors.js';
import { useSignUp } from './api.js';
import { AuthFrame } from '../../components/ui/AuthFrame.js';
import { safeNext } from './safeNext.js';

const fields = ['name', 'email', 'password'] as const;

export function SignUpPage() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const signUp = useSignUp();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    // Signing up from an invitation link: the token proves the invited mailbox, so no second mail is needed.
    const invitationToken = /^\/invitations\/([A-Za-z0-9_-]{43})$/.exec(safeNext(search))?.[1];
    const checked = checkForm(signUpSchema, { name: form.get('name'), email: form.get('email'), password: form.get('password'), ...(invitationToken ? { invitationToken } : {}) });
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    signUp.mutate(checked.data, {
      onSuccess: () => navigate(safeNext(search), { replace: true }),
      onError: (error) => setErrors(errorsFromApi(error, fields)),
    });
  }

  return (
    <AuthFrame
      title="Create your account"
      footer={
        <>
          Already have an account?{' '}
          <Link to={{ pathname: '/sign-in', search: search.toString() }} className="font-medium text-accent hover:underline">
            Sign in
          </Link>
        </>
      }
    >
      <title>Create account · Orbitab</title>
      <form noValidate onSubmit={submit} className="flex flex-col gap-3">
        {errors.form && <Notice tone="error">{errors.form}</Notice>}
        <TextField label="Name" name="name" autoComplete="name" autoFocus required error={errors.fields.name} />
        <TextField label="Email" name="email" type="email" autoComplete="email" required error={errors.fields.email} />
        <TextField
          label="Password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          hint={`At least ${passwordMinLength} characters.`}
          error={errors.fields.password}
        />
        <Button type="submit" variant="primary" busy={signUp.isPending} className="mt-1 h-8 w-full">
          {signUp.isPending ? 'Creating account…' : 'Create account'}
        </Button>
      </form>
    </AuthFrame>
  );
}
