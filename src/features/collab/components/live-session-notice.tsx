import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import type { SessionSnapshot } from '../../../lib/live-session/session-connection';

const ENDED_TITLES = {
  removed: 'You are no longer in this studio',
  'signed-out': 'You were signed out',
  'account-deleted': 'This account was deleted',
  'session-deleted': 'This session was deleted',
  closed: 'The session closed',
} as const;

export interface LiveSessionNoticeProps {
  snapshot: Pick<SessionSnapshot, 'accessEnded' | 'notice' | 'readOnly' | 'readOnlyReason' | 'role'>;
  /** Where the person was (for signing in again and coming back). */
  here: string;
  /** The studio's sessions, for a way out. */
  studioHref: string;
  /** Opens the session again (after signing in again on this device, for instance). */
  onReopen: () => void;
}

/**
 * What the server said about this person's place in the live session: access ended (removed,
 * signed out, account or session deleted), read-only now (role, archive), writable again, an edit
 * refused, or edits not being saved. One notice at a time, the most serious first.
 */
export function LiveSessionNotice({ snapshot, here, studioHref, onReopen }: LiveSessionNoticeProps) {
  const { accessEnded, notice } = snapshot;
  if (accessEnded) {
    return (
      <div data-testid="live-access-ended" data-reason={accessEnded.reason}>
        <Notice tone="error" title={ENDED_TITLES[accessEnded.reason]}>
          <p>
            {accessEnded.reason === 'signed-out' || accessEnded.reason === 'closed' ? `${accessEnded.message}. ` : ''}
            The page shows the session as it was; nothing you do here is saved.
          </p>
          <p className="mt-2 flex flex-wrap items-center gap-3">
            {accessEnded.reason === 'signed-out' ? (
              <>
                <Link className="underline" to={`/sign-in?next=${encodeURIComponent(here)}`}>
                  Sign in again
                </Link>
                <Button variant="secondary" onClick={onReopen}>
                  Open the session again
                </Button>
              </>
            ) : (
              <Link className="underline" to={accessEnded.reason === 'session-deleted' ? studioHref : '/'}>
                {accessEnded.reason === 'session-deleted' ? 'Back to the sessions' : 'Back to your studios'}
              </Link>
            )}
          </p>
        </Notice>
      </div>
    );
  }
  return (
    <>
      {notice && (
        <div data-testid="live-notice">
          <Notice tone={notice.tone}>{notice.message}</Notice>
        </div>
      )}
      {snapshot.readOnly && notice?.tone !== 'caution' && (
        <div data-testid="read-only-notice">
          <Notice tone="caution">{snapshot.readOnlyReason ?? `You can watch and listen: your role (${snapshot.role}) does not edit sessions.`}</Notice>
        </div>
      )}
    </>
  );
}
