import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { changePasswordInputSchema, useChangePassword } from '../api/change-password';
import { blamesField, withFieldLabels } from '../../../lib/form-errors';
import { NewPasswordField } from '../../../components/new-password-field';
import { passwordProblem } from '../../../lib/password-rules';

const LABELS = { currentPassword: 'Current password', newPassword: 'New password' };
const EMPTY = { currentPassword: '', newPassword: '' };

/** Change your password: the rules are checked here first, then by the server. */
export function PasswordForm({ email }: { email: string }) {
  const change = useChangePassword();
  const fields = useFieldErrors();
  const [form, setForm] = useState(EMPTY);
  const [weakness, setWeakness] = useState<string | null>(null);
  const [done, setDone] = useState(false);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setDone(false);
    change.reset();
    const input = fields.check(changePasswordInputSchema, form);
    const weak = passwordProblem(form.newPassword, email, LABELS.newPassword);
    setWeakness(weak);
    if (!input || weak) return;
    change.mutate(input, {
      onSuccess: () => {
        setForm(EMPTY);
        setDone(true);
      },
      onError: (error) => fields.fromServer(withFieldLabels(error, LABELS)),
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex max-w-md flex-col gap-2">
      {/* Lets password managers file the new password under the right account. */}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        value={form.currentPassword}
        onChange={(event) => setForm({ ...form, currentPassword: event.target.value })}
        error={fields.errors.currentPassword}
      />
      <NewPasswordField
        label={LABELS.newPassword}
        value={form.newPassword}
        onValueChange={(newPassword) => setForm({ ...form, newPassword })}
        weakness={weakness}
        serverError={fields.errors.newPassword}
      />
      {change.isError && !blamesField(change.error, ['currentPassword', 'newPassword']) && (
        <Notice tone="error" title="The password did not change">
          {change.error.message}
        </Notice>
      )}
      {done && <Notice tone="success">Password changed. Other devices where you were signed in are now signed out; this one stays signed in.</Notice>}
      <Button type="submit" busy={change.isPending} className="mt-2 self-start">
        Change password
      </Button>
    </form>
  );
}
