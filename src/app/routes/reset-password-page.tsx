import { useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { AuthFrame } from '../../components/auth-frame';
import { Button } from '../../components/button';
import { Notice } from '../../components/notice';
import { blamesField, withFieldLabels } from '../../lib/form-errors';
import { NewPasswordField } from '../../components/new-password-field';
import { passwordProblem } from '../../lib/password-rules';
import { confirmPasswordResetInputSchema, useConfirmPasswordReset } from '../../features/auth/api/confirm-password-reset';
import { ApiRequestError } from '../../lib/api-error';
import { useFieldErrors } from '../../lib/use-field-errors';

const linkClass = 'font-semibold text-brass-600 underline focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-brass-400';

/** `/reset-password?token=…`: choose a new password with the link from the mail. */
export default function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const confirm = useConfirmPasswordReset();
  const fields = useFieldErrors();
  const [password, setPassword] = useState('');
  const [weakness, setWeakness] = useState<string | null>(null);

  if (!token) {
    return (
      <AuthFrame title="Choose a new password">
        <BadLink message="This link carries no reset token. Open the link from the e-mail again, whole" />
      </AuthFrame>
    );
  }
  if (confirm.isSuccess) {
    return (
      <AuthFrame title="Password changed">
        <Notice tone="success" title="Your new password is set">
          Every device that was signed in to your account has been signed out.
        </Notice>
        <p className="mt-4">
          <Link className={linkClass} to="/sign-in">
            Sign in with the new password
          </Link>
        </p>
      </AuthFrame>
    );
  }

  const submit = (event: FormEvent) => {
    event.preventDefault();
    confirm.reset();
    const input = fields.check(confirmPasswordResetInputSchema, { token, password });
    const weak = passwordProblem(password, undefined);
    setWeakness(weak);
    if (!input || weak) return;
    confirm.mutate(input, { onError: (error) => fields.fromServer(withFieldLabels(error, { password: 'Password' })) });
  };
  const tokenProblem = confirm.error instanceof ApiRequestError ? confirm.error.fieldMessage('token') : undefined;

  return (
    <AuthFrame title="Choose a new password">
      <form onSubmit={submit} noValidate className="flex flex-col gap-2">
        <NewPasswordField label="New password" value={password} onValueChange={setPassword} weakness={weakness} serverError={fields.errors.password} autoFocus />
        {tokenProblem && <BadLink message={tokenProblem} />}
        {confirm.isError && !tokenProblem && !blamesField(confirm.error, ['password']) && (
          <Notice tone="error" title="The password did not change">
            {confirm.error.message}
          </Notice>
        )}
        <Button type="submit" busy={confirm.isPending} className="mt-2">
          Set the new password
        </Button>
      </form>
    </AuthFrame>
  );
}

function BadLink({ message }: { message: string }) {
  return (
    <Notice tone="error" title="This reset link does not work">
      <p>{message}.</p>
      <p className="mt-2">
        <Link className={linkClass} to="/forgot-password">
          Ask for a new link
        </Link>
      </p>
    </Notice>
  );
}
