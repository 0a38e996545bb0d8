import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { passwordMinLength, passwordProblem, passwordResetRequestSchema } from '../../../shared/auth.js';
import { Button } from '../../components/ui/Button.js';
import { Notice } from '../../components/ui/Notice.js';
import { TextField } from '../../components/ui/TextField.js';
import { checkForm, errorsFromApi, sentence, type FormErrors } from '../../lib/fieldErrors.js';
import { useRequestReset, useResetPassword } from './accountApi.js';
import { AuthFrame } from '../../components/ui/AuthFrame.js';

const backToSignIn = (
  <Link to="/sign-in" className="font-medium text-accent hover:underline">
    Back to sign-in
  </Link>
);

/** Asks for a reset link by e-mail; the answer is the same whether or not the address has an account. */
export function ForgotPasswordPage() {
  const request = useRequestReset();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const checked = checkForm(passwordResetRequestSchema, { email: new FormData(event.currentTarget).get('email') });
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({ fields: {} });
    request.mutate(checked.data.email, { onError: (error) => setErrors(errorsFromApi(error, ['email'])) });
  }

  return (
    <AuthFrame title="Forgot your password?" footer={backToSignIn}>
      <title>Forgot password · Orbitab</title>
      {request.isSuccess ? (
        <Notice tone="success" title="Check your mail">
          {sentence(request.data.message)}
        </Notice>
      ) : (
        <form noValidate onSubmit={submit} className="flex flex-col gap-3">
          <p className="text-ui text-ink-2">We will e-mail a link for choosing a new password to the address of your account.</p>
          {errors.form && <Notice tone="error">{errors.form}</Notice>}
          <TextField label="Email" name="email" type="email" autoComplete="username" autoFocus required error={errors.fields.email} />
          <Button type="submit" variant="primary" busy={request.isPending} className="mt-1 h-8 w-full">
            {request.isPending ? 'Sending…' : 'Send the link'}
          </Button>
        </form>
      )}
    </AuthFrame>
  );
}

/** Where the reset mail's link lands: a new password, then sign in again everywhere. */
export function ResetPasswordPage() {
  const { token = '' } = useParams();
  const reset = useResetPassword(token);
  const navigate = useNavigate();
  const [errors, setErrors] = useState<FormErrors>({ fields: {} });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const password = String(new FormData(event.currentTarget).get('password') ?? '');
    const problem = passwordProblem(password);
    if (problem) return setErrors({ fields: { password: sentence(problem) } });
    setErrors({ fields: {} });
    reset.mutate(password, {
      onSuccess: () => navigate('/sign-in?passwordReset=1', { replace: true }),
      onError: (error) => setErrors(errorsFromApi(error, ['password'])),
    });
  }

  return (
    <AuthFrame title="Choose a new password" footer={backToSignIn}>
      <title>New password · Orbitab</title>
      <form noValidate onSubmit={submit} className="flex flex-col gap-3">
        {errors.form && <Notice tone="error">{errors.form}</Notice>}
        <TextField
          label="New password"
          name="password"
          type="password"
          autoComplete="new-password"
          autoFocus
          required
          hint={`At least ${passwordMinLength} characters. Every signed-in session of the account ends.`}
          error={errors.fields.password}
        />
        <Button type="submit" variant="primary" busy={reset.isPending} className="mt-1 h-8 w-full">
          {reset.isPending ? 'Saving…' : 'Save the new password'}
        </Button>
      </form>
    </AuthFrame>
  );
}
