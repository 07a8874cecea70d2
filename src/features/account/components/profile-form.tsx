import { useState, type FormEvent } from 'react';
import type { UserView } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { updateProfileInputSchema, useUpdateProfile } from '../api/update-profile';
import { blamesField, withFieldLabels } from '../../../lib/form-errors';

/** Your name as your studios see it. */
export function ProfileForm({ user }: { user: UserView }) {
  const update = useUpdateProfile();
  const fields = useFieldErrors();
  const [displayName, setDisplayName] = useState(user.displayName);
  const [saved, setSaved] = useState<string | null>(null);
  const unchanged = displayName.trim() === user.displayName;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(null);
    update.reset();
    const input = fields.check(updateProfileInputSchema, { displayName });
    if (!input) return;
    update.mutate(input, {
      onSuccess: (saved) => {
        setDisplayName(saved.displayName);
        setSaved(saved.displayName);
      },
      onError: (error) => fields.fromServer(withFieldLabels(error, { displayName: 'Display name' })),
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2">
      <p className="text-sm">
        You sign in as <span className="font-semibold">{user.email}</span>.
      </p>
      <div className="flex flex-wrap items-start gap-3">
        <TextField
          className="min-w-64 flex-1"
          label="Display name"
          autoComplete="name"
          value={displayName}
          onChange={(event) => setDisplayName(event.target.value)}
          error={fields.errors.displayName}
          hint="Your studios see this name in member lists, beside your pointer in a session and on what you edit."
        />
        <Button type="submit" className="mt-6" busy={update.isPending} disabledReason={unchanged && !update.isPending ? 'The name is unchanged' : undefined}>
          Save name
        </Button>
      </div>
      {update.isError && !blamesField(update.error, ['displayName']) && (
        <Notice tone="error" title="The name was not saved">
          {update.error.message}
        </Notice>
      )}
      {saved && <Notice tone="success">Saved: your studios now see you as {saved}.</Notice>}
    </form>
  );
}
