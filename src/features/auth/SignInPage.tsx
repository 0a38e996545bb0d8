import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { signInSchema } from '../../../shared/auth.js';
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, type FormErrors } from '../../lib/fieldErrors.js';
import { useSignIn } from './api.js';
import { AuthFrame } from '../../components/ui/AuthFrame.js';
import { safeNext } from './safeNext.js';

const fields = ['email', 'password'] as const;

export function SignInPage() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const checked = checkForm(signInSchema, { email: form.get('email'), password: form.get('password') });
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    signIn.mutate(checked.data, {
      onSuccess: () => navigate(safeNext(search), { replace: true }),
      onError: (error) => setErrors(errorsFromApi(error, fields)),
    });
  }

  return (
    <AuthFrame
      title="Sign in"
      footer={
        <>
          New to Orbitab?{' '}
          <Link to={{ pathname: '/sign-up', search: search.toString() }} className="font-medium text-accent hover:underline">
            Create an account
          </Link>
        </>
      }
    >
      <title>Sign in · Orbitab</title>
      <form noValidate onSubmit={submit} className="flex flex-col gap-3">
        {search.get('signedOut') && !errors.form && <Notice tone="success">You are signed out.</Notice>}
        {search.get('passwordReset') && !errors.form && <Notice tone="success">Your new password is saved. Sign in with it.</Notice>}
        {errors.form && <Notice tone="error">{errors.form}</Notice>}
        <TextField label="Email" name="email" type="email" autoComplete="username" autoFocus required error={errors.fields.email} />
        <TextField label="Password" name="password" type="password" autoComplete="current-password" required error={errors.fields.password} />
        <Link to="/forgot-password" className="-mt-1 self-end text-caption text-accent hover:underline">
          Forgot your password?
        </Link>
        <Button type="submit" variant="primary" busy={signIn.isPending} className="mt-1 h-8 w-full">
          {signIn.isPending ? 'Signing in…' : 'Sign in'}
        </Button>
      </form>
    </AuthFrame>
  );
}
