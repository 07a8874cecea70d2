import { Link } from 'react-router-dom';
import { can } from '../../../shared/access/roles';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { DeleteAccountForm } from '../../features/account/components/delete-account-form';
import { PasswordForm } from '../../features/account/components/password-form';
import { ProfileForm } from '../../features/account/components/profile-form';
import { useMe } from '../../lib/queries/get-me';

const sectionClass = 'mb-8 rounded-lg border border-slate-700/15 p-4 dark:border-slate-300/10';

/** Your account: name, password, studios, and deleting it. */
export default function AccountPage() {
  const me = useMe();
  if (me.isPending) return <LoadingBlock label="Loading your account…" />;
  if (me.isError) {
    return (
      <Notice tone="error" title="Cannot load your account">
        {me.error.message}
      </Notice>
    );
  }
  if (!me.data) return null;
  const { user, studios } = me.data;

  return (
    <div className="max-w-3xl">
      <PageHeader title="Your account" subtitle={user.email} />
      <section aria-labelledby="profile-heading" className={sectionClass}>
        <h2 id="profile-heading" className="mb-3 text-lg font-semibold">
          Name
        </h2>
        <ProfileForm user={user} />
      </section>
      <section aria-labelledby="password-heading" className={sectionClass}>
        <h2 id="password-heading" className="mb-3 text-lg font-semibold">
          Password
        </h2>
        <PasswordForm email={user.email} />
      </section>
      <section aria-labelledby="studios-heading" className={sectionClass}>
        <h2 id="studios-heading" className="mb-3 text-lg font-semibold">
          Your studios
        </h2>
        {studios.length === 0 ? (
          <p className="text-sm text-slate-700 dark:text-slate-300">
            You are in no studio yet.{' '}
            <Link className="font-semibold text-brass-600 underline dark:text-brass-400" to="/studios/new">
              Create one
            </Link>
            , or open an invitation link from your mail.
          </p>
        ) : (
          <ul className="flex flex-col gap-1 text-sm">
            {studios.map((studio) => (
              <li key={studio.id} className="flex flex-wrap items-baseline gap-x-2">
                <Link className="font-semibold underline-offset-2 hover:underline focus-visible:outline-2 focus-visible:outline-teal-400" to={`/studios/${studio.id}`}>
                  {studio.name}
                </Link>
                <span className="text-slate-700 dark:text-slate-300">{studio.role}</span>
                {can(studio.role, 'manageMembers') && (
                  <Link className="text-brass-600 underline dark:text-brass-400" to={`/studios/${studio.id}/members`}>
                    members
                  </Link>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="delete-heading" className="rounded-lg border border-ember-500/40 p-4">
        <h2 id="delete-heading" className="mb-3 text-lg font-semibold">
          Delete your account
        </h2>
        <DeleteAccountForm />
      </section>
    </div>
  );
}
