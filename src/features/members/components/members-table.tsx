import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ROLES, type Role } from '../../../../shared/access/roles';
import type { MemberView, StudioSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { DataTable, type Column } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { LoadingBlock } from '../../../components/loading-block';
import { Notice } from '../../../components/notice';
import { useChangeRole } from '../api/change-role';
import { useMembers } from '../api/get-members';
import { useRemoveMember } from '../api/remove-member';
import { formatDate, formatDateTime } from '../format-time';
import { LAST_LEAD_REASON, ROLE_NAMES, ROLE_SUMMARIES } from '../role-words';
import { ConfirmAction } from '../../../components/confirm-action';
import { RoleSelect } from './role-select';

export interface MembersTableProps {
  studio: StudioSummary;
  /** The signed-in user: their own row says "you", and removing it means leaving. */
  meId: string;
}

/**
 * The studio's members with a role picker and a remove button each. The only lead's controls are
 * locked with the reason; the server refuses the same (409) and its message is shown if it comes.
 */
export function MembersTable({ studio, meId }: MembersTableProps) {
  const members = useMembers(studio.id);
  const changeRole = useChangeRole(studio.id);
  const remove = useRemoveMember(studio.id);
  const navigate = useNavigate();
  const [selfDemotion, setSelfDemotion] = useState<Role | null>(null);
  /** A role change asked for and waiting for its confirmation; then what happened, said once. */
  const [asked, setAsked] = useState<{ member: MemberView; role: Role } | null>(null);
  const [done, setDone] = useState<string | null>(null);

  if (members.isPending) return <LoadingBlock label="Loading members…" rows={3} />;
  if (members.isError) {
    return (
      <Notice tone="error" title="Cannot load the members">
        {members.error.message}
      </Notice>
    );
  }
  if (members.data.length === 0) return <EmptyState title="No members">Invite someone below.</EmptyState>;

  const leads = members.data.filter((member) => member.role === 'lead');
  const isOnlyLead = (member: MemberView) => member.role === 'lead' && leads.length === 1;

  const requestRole = (member: MemberView, role: Role) => {
    if (role === member.role) return;
    changeRole.reset();
    remove.reset();
    setDone(null);
    if (member.userId === meId && member.role === 'lead') {
      setSelfDemotion(role);
      return;
    }
    setAsked({ member, role });
  };
  const confirmRole = () => {
    if (!asked) return;
    const { member, role } = asked;
    changeRole.mutate(
      { userId: member.userId, input: { role } },
      {
        onSuccess: () => setDone(`${member.displayName} is now ${role === 'lead' ? 'a lead' : `a ${role}`}: ${ROLE_SUMMARIES[role].charAt(0).toLowerCase()}${ROLE_SUMMARIES[role].slice(1)}`),
        onSettled: () => setAsked(null),
      },
    );
  };
  const shownRole = (member: MemberView): Role => {
    if (changeRole.isPending && changeRole.variables?.userId === member.userId) return changeRole.variables.input.role;
    if (member.userId === meId && selfDemotion) return selfDemotion;
    if (asked?.member.userId === member.userId) return asked.role;
    return member.role;
  };

  const columns: Column<MemberView>[] = [
    {
      key: 'name',
      header: 'Name',
      sortValue: (member) => member.displayName.toLowerCase(),
      render: (member) => (
        <span className="font-semibold">
          {member.displayName}
          {member.userId === meId && <span className="ml-2 rounded bg-brass-400/20 px-1.5 py-0.5 text-xs font-normal">you</span>}
        </span>
      ),
    },
    { key: 'email', header: 'E-mail', sortValue: (member) => member.email, render: (member) => member.email },
    {
      key: 'role',
      header: 'Role',
      sortValue: (member) => ROLES.indexOf(member.role),
      render: (member) => (
        <RoleSelect
          label={`Role of ${member.displayName}`}
          value={shownRole(member)}
          onChange={(role) => requestRole(member, role)}
          busy={changeRole.isPending && changeRole.variables?.userId === member.userId}
          disabledReason={isOnlyLead(member) ? LAST_LEAD_REASON : undefined}
        />
      ),
    },
    { key: 'joinedAt', header: 'Joined', className: 'whitespace-nowrap', sortValue: (member) => Date.parse(member.joinedAt), render: (member) => formatDate(member.joinedAt) },
    {
      key: 'lastSeenAt',
      header: 'Last seen',
      className: 'whitespace-nowrap',
      sortValue: (member) => (member.lastSeenAt ? Date.parse(member.lastSeenAt) : 0),
      render: (member) => (member.lastSeenAt ? formatDateTime(member.lastSeenAt) : 'Not yet'),
    },
    {
      key: 'actions',
      header: 'Actions',
      // Wide enough for the confirmation, so the table does not reflow when it appears.
      className: 'w-56 whitespace-nowrap text-right',
      render: (member) => {
        const own = member.userId === meId;
        return (
          <ConfirmAction
            label={own ? 'Leave' : 'Remove'}
            ariaLabel={own ? `Leave ${studio.name}` : `Remove ${member.displayName}`}
            question={own ? `Leave ${studio.name}?` : `Remove ${member.displayName} from ${studio.name}?`}
            confirmLabel={own ? 'Yes, leave' : 'Yes, remove'}
            busy={remove.isPending && remove.variables === member.userId}
            disabledReason={isOnlyLead(member) ? LAST_LEAD_REASON : undefined}
            onConfirm={() => {
              changeRole.reset();
              remove.mutate(member.userId, { onSuccess: () => (own ? navigate('/', { replace: true }) : undefined) });
            }}
          />
        );
      },
    },
  ];

  const onlyLead = leads.length === 1 ? leads[0] : undefined;
  return (
    <div className="flex flex-col gap-3">
      {onlyLead && (
        <p className="text-sm text-slate-700 dark:text-slate-300">
          {onlyLead.userId === meId ? 'You are' : `${onlyLead.displayName} is`} the only lead, so that role and membership are locked. {LAST_LEAD_REASON}.
        </p>
      )}
      {selfDemotion && (
        <Notice tone="caution" title={`Become a ${selfDemotion} yourself?`}>
          <p>You would no longer invite people, change roles or remove members in {studio.name}.</p>
          <div className="mt-3 flex gap-2">
            <Button
              busy={changeRole.isPending}
              onClick={() =>
                changeRole.mutate({ userId: meId, input: { role: selfDemotion } }, { onSettled: () => setSelfDemotion(null) })
              }
            >
              Become {ROLE_NAMES[selfDemotion].toLowerCase()}
            </Button>
            <Button variant="ghost" disabled={changeRole.isPending} onClick={() => setSelfDemotion(null)}>
              Stay lead
            </Button>
          </div>
        </Notice>
      )}
      {asked && (
        <Notice tone="caution" title={`Make ${asked.member.displayName} ${asked.role === 'lead' ? 'a lead' : `a ${asked.role}`}?`}>
          <p>
            {ROLE_NAMES[asked.role]}: {ROLE_SUMMARIES[asked.role]} Now {ROLE_NAMES[asked.member.role].toLowerCase()}: {ROLE_SUMMARIES[asked.member.role]} Open sessions follow the change at once.
          </p>
          <div className="mt-3 flex gap-2">
            <Button busy={changeRole.isPending} onClick={confirmRole}>
              Yes, make {ROLE_NAMES[asked.role].toLowerCase()}
            </Button>
            <Button variant="ghost" disabled={changeRole.isPending} onClick={() => setAsked(null)}>
              Keep {ROLE_NAMES[asked.member.role].toLowerCase()}
            </Button>
          </div>
        </Notice>
      )}
      {done && <Notice tone="success">{done}</Notice>}
      {changeRole.isError && (
        <Notice tone="error" title="The role did not change">
          {changeRole.error.message}
        </Notice>
      )}
      {remove.isError && (
        <Notice tone="error" title={remove.variables === meId ? 'You are still a member' : 'Nobody was removed'}>
          {remove.error.message}
        </Notice>
      )}
      <DataTable caption={`Members of ${studio.name}`} rows={members.data} columns={columns} rowKey={(member) => member.userId} initialSort={{ key: 'name', direction: 'ascending' }} />
    </div>
  );
}
