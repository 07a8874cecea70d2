import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { deleteAccountInputSchema, forgetDeletedAccount, useDeleteAccount } from '../api/delete-account';
import { blamesField, withFieldLabels } from '../../../lib/form-errors';

/**
 * Deleting the account takes two steps: open the form, then type the password. While you are the
 * last lead of a studio with other members the server refuses (409) and names the studio.
 */
export function DeleteAccountForm() {
  const remove = useDeleteAccount();
  const fields = useFieldErrors();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  const [password, setPassword] = useState('');
  const [returnFocus, setReturnFocus] = useState(false);
  const wrapper = useRef<HTMLDivElement>(null);

  // Back on the button that opened the form once it is withdrawn.
  useEffect(() => {
    if (!returnFocus) return;
    wrapper.current?.querySelector<HTMLButtonElement>('[data-delete-open]')?.focus();
    setReturnFocus(false);
  }, [returnFocus]);

  const close = () => {
    setOpen(false);
    setReturnFocus(true);
    setPassword('');
    fields.clear();
    remove.reset();
  };
  const submit = (event: FormEvent) => {
    event.preventDefault();
    remove.reset();
    const input = fields.check(deleteAccountInputSchema, { password });
    if (!input) return;
    remove.mutate(input, {
      onSuccess: async () => {
        await navigate('/sign-in', { replace: true });
        forgetDeletedAccount(queryClient);
      },
      onError: (error) => fields.fromServer(withFieldLabels(error, { password: 'Password' })),
    });
  };

  return (
    <div ref={wrapper} className="flex flex-col gap-3">
      <p className="text-sm text-slate-700 dark:text-slate-300">
        You leave every studio. A studio where you are the only member is deleted with your account, its sessions and presets too. This cannot be undone.
      </p>
      {!open ? (
        <Button data-delete-open variant="danger" className="self-start" onClick={() => setOpen(true)}>
          Delete my account…
        </Button>
      ) : (
        <form onSubmit={submit} noValidate className="flex max-w-md flex-col gap-2 rounded-md border border-ember-500/50 p-4">
          <TextField
            label="Type your password to confirm"
            type="password"
            autoComplete="current-password"
            value={password}
            onChange={(event) => setPassword(event.target.value)}
            error={fields.errors.password}
            autoFocus
          />
          {remove.isError && !blamesField(remove.error, ['password']) && (
            <Notice tone="error" title="Your account was not deleted">
              {remove.error.message}
            </Notice>
          )}
          <div className="mt-2 flex gap-2">
            <Button type="submit" variant="danger" busy={remove.isPending}>
              Delete my account for good
            </Button>
            <Button variant="ghost" disabled={remove.isPending} onClick={close}>
              Keep my account
            </Button>
          </div>
        </form>
      )}
    </div>
  );
}
