import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { AuthFrame } from '../../components/auth-frame';
import { Button } from '../../components/button';
import { Notice } from '../../components/notice';
import { TextField } from '../../components/text-field';
import { blamesField, withFieldLabels } from '../../lib/form-errors';
import { requestPasswordResetInputSchema, useRequestPasswordReset } from '../../features/auth/api/request-password-reset';
import { useFieldErrors } from '../../lib/use-field-errors';

const linkClass = 'font-semibold text-brass-600 underline focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-brass-400';

/** Ask for a reset link. The answer never tells whether an account uses the address. */
export default function ForgotPasswordPage() {
  const request = useRequestPasswordReset();
  const fields = useFieldErrors();
  const [email, setEmail] = useState('');
  const [sentTo, setSentTo] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSentTo(null);
    request.reset();
    const input = fields.check(requestPasswordResetInputSchema, { email });
    if (!input) return;
    request.mutate(input, { onSuccess: () => setSentTo(input.email), onError: (error) => fields.fromServer(withFieldLabels(error, { email: 'E-mail' })) });
  };

  return (
    <AuthFrame title="Forgot your password">
      <form onSubmit={submit} noValidate className="flex flex-col gap-2">
        <p className="mb-2 text-sm">Give the address you sign in with. We mail it a link to choose a new password; the link works once, for one hour.</p>
        <TextField label="E-mail" type="email" autoComplete="email" value={email} onChange={(event) => setEmail(event.target.value)} error={fields.errors.email} />
        {sentTo && (
          <Notice tone="success" title="Check your mail">
            If an account uses {sentTo}, a link to choose a new password is on its way. Nothing arrived after a few minutes? Look in the spam folder, or ask again.
          </Notice>
        )}
        {request.isError && !blamesField(request.error, ['email']) && (
          <Notice tone="error" title="The link was not sent">
            {request.error.message}
          </Notice>
        )}
        <Button type="submit" busy={request.isPending} className="mt-2">
          {sentTo ? 'Send another link' : 'Send the link'}
        </Button>
        <p className="mt-4 text-sm">
          Remembered it?{' '}
          <Link className={linkClass} to="/sign-in">
            Sign in
          </Link>
        </p>
      </form>
    </AuthFrame>
  );
}
