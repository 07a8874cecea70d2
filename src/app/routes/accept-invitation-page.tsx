import { useState, type FormEvent } from 'react';
import { Link, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import type { InvitationPreview, MeResponse } from '../../../shared/api/responses';
import { AuthFrame } from '../../components/auth-frame';
import { Button } from '../../components/button';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { TextField } from '../../components/text-field';
import { blamesField, withFieldLabels } from '../../lib/form-errors';
import { NewPasswordField } from '../../components/new-password-field';
import { passwordProblem } from '../../lib/password-rules';
import { acceptAsNewAccountInputSchema, useAcceptInvitation } from '../../features/auth/api/accept-invitation';
import { useMe } from '../../lib/queries/get-me';
import { useInvitation } from '../../features/auth/api/get-invitation';
import { useSignOut } from '../../features/auth/api/sign-out';
import { formatDateTime } from '../../features/members/format-time';
import { ROLE_NAMES, ROLE_SUMMARIES } from '../../features/members/role-words';
import { ApiRequestError } from '../../lib/api-error';
import { useFieldErrors } from '../../lib/use-field-errors';

const linkClass = 'font-semibold text-brass-600 underline focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-brass-400';

/** `/invitations/accept?token=…`: what the invitation offers, and joining with a new or an existing account. */
export default function AcceptInvitationPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const invitation = useInvitation(token);

  if (!token) {
    return (
      <AuthFrame title="Join a studio">
        <Notice tone="error" title="This link carries no invitation">
          Open the link from your invitation e-mail again. If you copied it, copy all of it.
        </Notice>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title={invitation.data ? `Join ${invitation.data.studioName}` : 'Join a studio'}>
      {invitation.isPending ? (
        <LoadingBlock label="Opening the invitation…" rows={3} />
      ) : invitation.isError ? (
        <InvitationProblem error={invitation.error} />
      ) : (
        <div className="flex flex-col gap-4">
          <InvitationSummary invitation={invitation.data} />
          <JoinArea token={token} invitation={invitation.data} />
        </div>
      )}
    </AuthFrame>
  );
}

function InvitationProblem({ error }: { error: Error }) {
  const status = error instanceof ApiRequestError ? error.status : 0;
  if (status === 404) {
    return (
      <Notice tone="error" title="This invitation is not valid">
        It was revoked, or the link is not complete. Ask a lead of the studio to invite you again.
      </Notice>
    );
  }
  if (status === 409) {
    return (
      <div className="flex flex-col gap-3">
        <Notice tone="error" title="This invitation can no longer be used">
          {error.message}.
        </Notice>
        <p className="text-sm">
          Already accepted it?{' '}
          <Link className={linkClass} to="/sign-in">
            Sign in
          </Link>{' '}
          to reach the studio.
        </p>
      </div>
    );
  }
  return (
    <Notice tone="error" title="Cannot open the invitation">
      {error.message}
    </Notice>
  );
}

function InvitationSummary({ invitation }: { invitation: InvitationPreview }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
      <dt className="font-semibold">Studio</dt>
      <dd>{invitation.studioName}</dd>
      <dt className="font-semibold">Your role</dt>
      <dd>
        {ROLE_NAMES[invitation.role]} <span className="text-slate-700 dark:text-slate-300">· {ROLE_SUMMARIES[invitation.role]}</span>
      </dd>
      <dt className="font-semibold">For</dt>
      <dd className="break-all">{invitation.email}</dd>
      <dt className="font-semibold">Link works until</dt>
      <dd>{formatDateTime(invitation.expiresAt)}</dd>
    </dl>
  );
}

function sameAddress(me: MeResponse | null | undefined, email: string): boolean {
  return me?.user.email.toLowerCase() === email.toLowerCase();
}

/** What to do next: create the account, accept as the signed-in invitee, or sign in first. */
function JoinArea({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const me = useMe();
  if (!invitation.hasAccount) return <NewAccountForm token={token} invitation={invitation} signedInAs={me.data?.user.email} />;
  if (me.isPending) return <LoadingBlock label="Checking your sign-in…" rows={1} />;
  if (sameAddress(me.data, invitation.email)) return <AcceptAsMember token={token} invitation={invitation} />;
  return <SignInFirst invitation={invitation} signedInAs={me.data?.user.email} />;
}

function useJoined() {
  const navigate = useNavigate();
  return (answer: { studioId: string }) => navigate(`/studios/${answer.studioId}`, { replace: true });
}

function NewAccountForm({ token, invitation, signedInAs }: { token: string; invitation: InvitationPreview; signedInAs?: string }) {
  const accept = useAcceptInvitation();
  const joined = useJoined();
  const fields = useFieldErrors();
  const [form, setForm] = useState({ displayName: '', password: '' });
  const [weakness, setWeakness] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    accept.reset();
    const input = fields.check(acceptAsNewAccountInputSchema, { token, ...form });
    const weak = passwordProblem(form.password, invitation.email);
    setWeakness(weak);
    if (!input || weak) return;
    accept.mutate(input, { onSuccess: joined, onError: (error) => fields.fromServer(withFieldLabels(error, { displayName: 'Your name', password: 'Password' })) });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2">
      <p className="text-sm">Create your Tautline account to join. You will sign in with {invitation.email}.</p>
      {signedInAs && (
        <Notice tone="caution">
          You are signed in as {signedInAs}. Joining creates a new account for {invitation.email} and signs you in with it.
        </Notice>
      )}
      <input type="email" name="username" autoComplete="username" value={invitation.email} readOnly hidden />
      <TextField
        label="Your name"
        autoComplete="name"
        value={form.displayName}
        onChange={(event) => setForm({ ...form, displayName: event.target.value })}
        error={fields.errors.displayName}
        hint="How your studio sees you."
      />
      <NewPasswordField label="Password" value={form.password} onValueChange={(password) => setForm({ ...form, password })} weakness={weakness} serverError={fields.errors.password} />
      {accept.isError && !blamesField(accept.error, ['displayName', 'password']) && (
        <Notice tone="error" title="You have not joined yet">
          {accept.error.message}
        </Notice>
      )}
      <Button type="submit" busy={accept.isPending} className="mt-2">
        Create account and join
      </Button>
    </form>
  );
}

function AcceptAsMember({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const accept = useAcceptInvitation();
  const joined = useJoined();
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm">You are signed in as {invitation.email}.</p>
      {accept.isError && (
        <Notice tone="error" title="You have not joined yet">
          {accept.error.message}
        </Notice>
      )}
      <Button busy={accept.isPending} onClick={() => accept.mutate({ token }, { onSuccess: joined })}>
        Join {invitation.studioName}
      </Button>
    </div>
  );
}

function SignInFirst({ invitation, signedInAs }: { invitation: InvitationPreview; signedInAs?: string }) {
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const here = `${location.pathname}${location.search}`;
  if (signedInAs) {
    return (
      <div className="flex flex-col gap-3">
        <Notice tone="caution" title={`This invitation is for ${invitation.email}`}>
          You are signed in as {signedInAs}. Sign out, then sign in as {invitation.email} to accept it.
        </Notice>
        {signOut.isError && <Notice tone="error">{signOut.error.message}</Notice>}
        <Button variant="secondary" busy={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(here, { replace: true }) })}>
          Sign out of {signedInAs}
        </Button>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm">
        {invitation.email} already has a Tautline account. Sign in as {invitation.email} to accept; you come back here afterwards.
      </p>
      <Link
        to={`/sign-in?next=${encodeURIComponent(here)}`}
        className="inline-flex items-center justify-center rounded-md bg-brass-500 px-4 py-2 text-sm font-semibold text-slate-950 hover:bg-brass-400 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400"
      >
        Sign in as {invitation.email}
      </Link>
      <p className="text-sm">
        <Link className={linkClass} to="/forgot-password">
          Forgot that password?
        </Link>
      </p>
    </div>
  );
}
