import { useState, type FormEvent } from 'react';
import type { Role } from '../../../../shared/access/roles';
import type { InvitationView, StudioSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { ApiRequestError } from '../../../lib/api-error';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { blamesField, withFieldLabels } from '../../../lib/form-errors';
import { inviteMemberInputSchema, useInviteMember } from '../api/invite-member';
import { formatDateTime } from '../format-time';
import { ROLE_SUMMARIES } from '../role-words';
import { RoleSelect } from './role-select';

const LABELS = { email: 'E-mail', role: 'Role' };

/** Invite by e-mail with a role: checked in the browser with the server's schema, then by the server. */
export function InviteForm({ studio }: { studio: StudioSummary }) {
  const invite = useInviteMember(studio.id);
  const fields = useFieldErrors();
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('designer');
  const [sent, setSent] = useState<InvitationView | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSent(null);
    invite.reset();
    const input = fields.check(inviteMemberInputSchema, { email, role });
    if (!input) return;
    invite.mutate(input, {
      onSuccess: (invitation) => {
        setSent(invitation);
        setEmail('');
      },
      onError: (error) => fields.fromServer(withFieldLabels(error, LABELS)),
    });
  };

  // "… is already a member" is a whole sentence that starts with the address: shown as the server wrote it.
  const conflict = invite.error instanceof ApiRequestError && invite.error.status === 409 && invite.error.field === 'email' ? invite.error.message : undefined;

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2">
      <div className="flex flex-wrap items-start gap-3">
        <TextField
          className="min-w-64 flex-1"
          label="E-mail"
          type="email"
          autoComplete="off"
          value={email}
          onChange={(event) => setEmail(event.target.value)}
          error={conflict ?? fields.errors.email}
        />
        <RoleSelect className="min-w-48" label="Role" showLabel value={role} onChange={setRole} hint={ROLE_SUMMARIES[role]} />
        <Button type="submit" className="mt-6" busy={invite.isPending}>
          Send invitation
        </Button>
      </div>
      {invite.isError && !blamesField(invite.error, ['email']) && (
        <Notice tone="error" title="The invitation was not sent">
          {fields.errors.role ?? invite.error.message}
        </Notice>
      )}
      {sent && (
        <Notice tone="success">
          Invitation sent to {sent.email} as a {sent.role}. The link works once, until {formatDateTime(sent.expiresAt)}.
        </Notice>
      )}
    </form>
  );
}
