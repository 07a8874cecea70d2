import { can, type Role } from '../../shared/access/roles';
import type { LiveAccessEndReason } from '../../shared/protocol/live-access';
import type { AppContext } from '../app-context';
import { userFromToken } from '../auth/authenticate';
import { Membership } from '../db/entities/membership';
import { Session } from '../db/entities/session';

/** What a live connection may do with a session now. */
export type LiveSessionAccess =
  | { ok: true; userId: string; studioId: string; role: Role; archived: boolean; readOnly: boolean }
  /** `unknown`: the session id never existed or belongs to a studio the user is not in (a 404, never told apart). */
  | { ok: false; reason: LiveAccessEndReason | 'unknown' };

type SessionRow = Pick<Session, 'id' | 'studioId' | 'archived'>;

/**
 * Memoised look-ups for one pass of access checks: each token is verified once, each membership
 * and each session read once, however many connections share them. A pass is short-lived (one
 * access change, or one safety-net sweep), so it never serves stale rows for long.
 */
export class AccessLookup {
  private readonly users = new Map<string, Promise<{ userId: string } | null>>();
  private readonly memberships = new Map<string, Promise<Role | null>>();
  private readonly sessions = new Map<string, Promise<SessionRow | null>>();

  constructor(private readonly context: AppContext) {}

  /** The user a token still belongs to (signature, expiry, token version, deny-list), or null. */
  user(token: string): Promise<{ userId: string } | null> {
    let found = this.users.get(token);
    if (!found) {
      found = userFromToken(this.context, token).then((result) => (result ? { userId: result.user.id } : null));
      this.users.set(token, found);
    }
    return found;
  }

  /** The user's role in the studio, or null when they are not a member. */
  role(userId: string, studioId: string): Promise<Role | null> {
    const key = `${userId}\n${studioId}`;
    let found = this.memberships.get(key);
    if (!found) {
      found = this.context.dataSource
        .getRepository(Membership)
        .findOne({ where: { userId, studioId }, select: { id: true, role: true } })
        .then((row) => row?.role ?? null);
      this.memberships.set(key, found);
    }
    return found;
  }

  session(sessionId: string): Promise<SessionRow | null> {
    let found = this.sessions.get(sessionId);
    if (!found) {
      found = sessionId
        ? this.context.dataSource.getRepository(Session).findOne({ where: { id: sessionId }, select: { id: true, studioId: true, archived: true } })
        : Promise.resolve(null);
      this.sessions.set(sessionId, found);
    }
    return found;
  }

  /** Whether the token still gives access to the studio (renders channel): its user is a member. */
  async studioAccess(token: string, studioId: string): Promise<{ ok: true; role: Role } | { ok: false; reason: LiveAccessEndReason }> {
    const user = await this.user(token);
    if (!user) return { ok: false, reason: 'signed-out' };
    const role = await this.role(user.userId, studioId);
    return role ? { ok: true, role } : { ok: false, reason: 'removed' };
  }

  /**
   * The one decision for a live session, used when a connection opens and every time it is
   * checked again: a valid token, membership of the session's studio, the role's right to edit,
   * and whether the session is archived (read-only for everyone) or gone.
   * `knownStudioId` is the studio the connection was opened in: when its session row is gone, the
   * session was deleted (rather than never being visible).
   */
  async sessionAccess(token: string, sessionId: string, knownStudioId?: string): Promise<LiveSessionAccess> {
    const user = await this.user(token);
    if (!user) return { ok: false, reason: 'signed-out' };
    const session = await this.session(sessionId);
    if (!session) return { ok: false, reason: knownStudioId ? 'session-deleted' : 'unknown' };
    const role = await this.role(user.userId, session.studioId);
    if (!role) return { ok: false, reason: knownStudioId === session.studioId ? 'removed' : 'unknown' };
    return { ok: true, userId: user.userId, studioId: session.studioId, role, archived: session.archived, readOnly: session.archived || !can(role, 'editSessions') };
  }
}
