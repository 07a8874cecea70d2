import { useParams } from 'react-router-dom';
import { ACTION_REASONS, can } from '../../../shared/access/roles';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { useMe } from '../../lib/queries/get-me';
import { InviteForm } from '../../features/members/components/invite-form';
import { MembersTable } from '../../features/members/components/members-table';
import { PendingInvitations } from '../../features/members/components/pending-invitations';
import NotFoundPage from './not-found-page';

const sectionClass = 'mb-8 rounded-lg border border-slate-700/15 p-4 dark:border-slate-300/10';

/** A studio's members: roles, removal, invitations. Leads only; the server enforces the same. */
export default function MembersPage() {
  const { studioId = '' } = useParams();
  const me = useMe();
  const studio = me.data?.studios.find((candidate) => candidate.id === studioId);
  if (!me.data || !studio) return <NotFoundPage />;

  if (!can(studio.role, 'manageMembers')) {
    return (
      <>
        <PageHeader title="Members" subtitle={studio.name} />
        <Notice title="Only leads manage members">
          In {studio.name} you are a {studio.role}: {ACTION_REASONS.manageMembers}. Ask a lead if someone should join or change role.
        </Notice>
      </>
    );
  }

  return (
    <>
      <PageHeader title="Members" subtitle={`${studio.name} · who works here, and in which role`} />
      <section aria-labelledby="members-heading" className={sectionClass}>
        <h2 id="members-heading" className="mb-3 text-lg font-semibold">
          Team
        </h2>
        <MembersTable studio={studio} meId={me.data.user.id} />
      </section>
      <section aria-labelledby="invite-heading" className={sectionClass}>
        <h2 id="invite-heading" className="mb-3 text-lg font-semibold">
          Invite someone
        </h2>
        <InviteForm studio={studio} />
      </section>
      <section aria-labelledby="invitations-heading" className={sectionClass}>
        <h2 id="invitations-heading" className="mb-3 text-lg font-semibold">
          Waiting invitations
        </h2>
        <PendingInvitations studio={studio} />
      </section>
    </>
  );
}
