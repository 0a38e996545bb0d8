import { useEffect, useRef } from 'react';
import { Link, useParams } from 'react-router';
import { Notice } from '../../components/ui/Notice.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useVerifyEmail } from './accountApi.js';
import { AuthFrame } from '../../components/ui/AuthFrame.js';

/** Where the verification mail's link lands: confirms the address as soon as it opens. */
export function VerifyEmailPage() {
  const { token = '' } = useParams();
  const verify = useVerifyEmail();
  const sent = useRef(false);
  useEffect(() => {
    // Once per page, also under React's double effects in development: the link works only once.
    if (sent.current) return;
    sent.current = true;
    verify.mutate(token);
  }, [token, verify]);

  return (
    <AuthFrame title="Confirm your address" footer={<Link to="/" className="font-medium text-accent hover:underline">Go to your workbooks</Link>}>
      <title>Confirm address · Orbitab</title>
      {verify.isPending && <p className="text-ui text-ink-2">Confirming…</p>}
      {verify.isSuccess && (
        <Notice tone="success" title="Address confirmed">
          {verify.data.user.email} is confirmed. Colleagues can now share workbooks with you.
        </Notice>
      )}
      {verify.isError && (
        <Notice tone="error" title="This link did not work">
          {sentence(verify.error.message)} Signed in, you can ask for a new link from your account page.
        </Notice>
      )}
    </AuthFrame>
  );
}
