import { useState } from 'react';
import type { InvitationView, StudioSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { DataTable, type Column } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { LoadingBlock } from '../../../components/loading-block';
import { Notice } from '../../../components/notice';
import { useInvitations } from '../api/get-invitations';
import { useResendInvitation } from '../api/resend-invitation';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { formatDateTime } from '../format-time';
import { ROLE_NAMES } from '../role-words';

/** Invitations sent but not yet accepted, with resend (a fresh link) and revoke. */
export function PendingInvitations({ studio }: { studio: StudioSummary }) {
  const invitations = useInvitations(studio.id);
  const resend = useResendInvitation(studio.id);
  const revoke = useRevokeInvitation(studio.id);
  const [resent, setResent] = useState<InvitationView | null>(null);

  if (invitations.isPending) return <LoadingBlock label="Loading invitations…" rows={2} />;
  if (invitations.isError) {
    return (
      <Notice tone="error" title="Cannot load the invitations">
        {invitations.error.message}
      </Notice>
    );
  }

  const now = Date.now();
  const startResend = (invitation: InvitationView) => {
    setResent(null);
    revoke.reset();
    resend.mutate(invitation.id, { onSuccess: setResent });
  };
  const startRevoke = (invitation: InvitationView) => {
    setResent(null);
    resend.reset();
    revoke.mutate(invitation.id);
  };
  const emailOf = (id: string | undefined) => invitations.data.find((invitation) => invitation.id === id)?.email ?? 'this address';

  const columns: Column<InvitationView>[] = [
    { key: 'email', header: 'E-mail', sortValue: (invitation) => invitation.email, render: (invitation) => invitation.email },
    { key: 'role', header: 'Role', render: (invitation) => ROLE_NAMES[invitation.role] },
    { key: 'sentAt', header: 'Sent', sortValue: (invitation) => Date.parse(invitation.sentAt), render: (invitation) => formatDateTime(invitation.sentAt) },
    {
      key: 'expiresAt',
      header: 'Link works until',
      sortValue: (invitation) => Date.parse(invitation.expiresAt),
      render: (invitation) =>
        Date.parse(invitation.expiresAt) <= now ? (
          <span className="rounded bg-ember-500/15 px-1.5 py-0.5 text-xs font-semibold text-ember-700 dark:text-ember-300">expired: resend for a new link</span>
        ) : (
          formatDateTime(invitation.expiresAt)
        ),
    },
    {
      key: 'actions',
      header: 'Actions',
      className: 'text-right',
      render: (invitation) => (
        <div className="flex justify-end gap-2">
          <Button
            variant="secondary"
            aria-label={`Resend the invitation to ${invitation.email}`}
            busy={resend.isPending && resend.variables === invitation.id}
            disabled={revoke.isPending && revoke.variables === invitation.id}
            onClick={() => startResend(invitation)}
          >
            Resend
          </Button>
          <Button
            variant="ghost"
            aria-label={`Revoke the invitation to ${invitation.email}`}
            busy={revoke.isPending && revoke.variables === invitation.id}
            disabled={resend.isPending && resend.variables === invitation.id}
            onClick={() => startRevoke(invitation)}
          >
            Revoke
          </Button>
        </div>
      ),
    },
  ];

  return (
    <div className="flex flex-col gap-3">
      {resend.isError && (
        <Notice tone="error" title={`The invitation to ${emailOf(resend.variables)} was not sent again`}>
          {resend.error.message}
        </Notice>
      )}
      {revoke.isError && (
        <Notice tone="error" title={`The invitation to ${emailOf(revoke.variables)} was not revoked`}>
          {revoke.error.message}
        </Notice>
      )}
      {resent && <Notice tone="success">A fresh link went to {resent.email}; the one sent before no longer works.</Notice>}
      {invitations.data.length === 0 ? (
        <EmptyState title="No invitations waiting">Invitations you send stay here until they are accepted or revoked.</EmptyState>
      ) : (
        <DataTable caption={`Invitations to ${studio.name} waiting for an answer`} rows={invitations.data} columns={columns} rowKey={(invitation) => invitation.id} initialSort={{ key: 'sentAt', direction: 'descending' }} />
      )}
    </div>
  );
}
