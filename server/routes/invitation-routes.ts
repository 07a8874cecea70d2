import { Router, type Response } from 'express';
import { IsNull } from 'typeorm';
import { acceptInvitationBody, inviteBody } from '../../shared/api/schemas';
import { fieldIssue } from '../../shared/patch/field-issue';
import type { AppContext } from '../app-context';
import { requireAccess } from '../access/studio-access';
import { currentUser, issueAuthCookie, requireUser, userFromRequest } from '../auth/authenticate';
import { hashPassword } from '../auth/password-hash';
import { hashSecretToken, newSecretToken } from '../auth/secret-token';
import { Invitation } from '../db/entities/invitation';
import { Membership } from '../db/entities/membership';
import { Studio } from '../db/entities/studio';
import { User } from '../db/entities/user';
import { ApiError, conflict, invalidFields, notFound } from '../http/api-error';
import { parseInput } from '../http/parse-input';
import { invitationMail } from '../mail/message-templates';
import { requireStrongPassword } from './auth-routes';
import { accountCounter, tooManyAttempts } from './rate-limits';
import { userView } from './user-view';

function invitationView(invitation: Invitation) {
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    sentAt: invitation.sentAt.toISOString(),
    acceptedAt: invitation.acceptedAt?.toISOString() ?? null,
  };
}

export function invitationRoutes(context: AppContext): Router {
  const router = Router();
  const invitations = () => context.dataSource.getRepository(Invitation);
  router.use('/studios/:studioId/invitations', requireUser(context));
  // Invitation e-mails per studio and address, however they are asked for (new, repeated, resent).
  const invitationMails = accountCounter(context, 'invitationMails');

  /** Makes a fresh token for an invitation, stores its hash and a new expiry, and e-mails the link. */
  async function sendInvitation(invitation: Invitation, inviter: User, response: Response): Promise<Invitation> {
    const mailKey = `${invitation.studioId} ${invitation.email}`;
    const waitS = invitationMails.retryAfterS(mailKey);
    if (waitS > 0) throw tooManyAttempts(response, waitS, `Too many invitation e-mails to ${invitation.email}`, 'email');
    invitationMails.record(mailKey);
    const { token, tokenHash } = newSecretToken();
    const now = context.clock();
    const expiresAt = new Date(now.getTime() + context.config.invitationLifetimeS * 1000);
    const saved = await invitations().save({ ...invitation, tokenHash, expiresAt, sentAt: now });
    const studio = await context.dataSource.getRepository(Studio).findOneByOrFail({ id: invitation.studioId });
    const link = `${context.config.appUrl}/invitations/accept?token=${token}`;
    await context.mailer.send(invitationMail(invitation.email, studio.name, invitation.role, inviter.displayName, link, expiresAt));
    return saved;
  }

  router.get('/studios/:studioId/invitations', async (request, response) => {
    const own = await requireAccess(context.dataSource, currentUser(request).id, request.params.studioId, 'manageMembers');
    const pending = await invitations().find({ where: { studioId: own.studioId, acceptedAt: IsNull(), revokedAt: IsNull() }, order: { createdAt: 'DESC' } });
    response.json({ invitations: pending.map(invitationView) });
  });

  router.post('/studios/:studioId/invitations', async (request, response) => {
    const user = currentUser(request);
    const own = await requireAccess(context.dataSource, user.id, request.params.studioId, 'manageMembers');
    const { email, role } = parseInput(inviteBody, request.body);
    const existingUser = await context.dataSource.getRepository(User).findOneBy({ email });
    if (existingUser && (await context.dataSource.getRepository(Membership).existsBy({ studioId: own.studioId, userId: existingUser.id }))) {
      throw conflict(`${email} is already a member of this studio`, 'email');
    }
    const open = await invitations().findOneBy({ studioId: own.studioId, email, acceptedAt: IsNull(), revokedAt: IsNull() });
    const draft = open ? { ...open, role } : invitations().create({ studioId: own.studioId, email, role, invitedById: user.id, acceptedAt: null, revokedAt: null });
    const invitation = await sendInvitation(draft as Invitation, user, response);
    response.status(open ? 200 : 201).json({ invitation: invitationView(invitation) });
  });

  async function pendingInvitation(studioId: string, invitationId: string): Promise<Invitation> {
    const invitation = await invitations().findOneBy({ id: invitationId, studioId, acceptedAt: IsNull(), revokedAt: IsNull() });
    if (!invitation) throw notFound('Invitation');
    return invitation;
  }

  router.post('/studios/:studioId/invitations/:invitationId/resend', async (request, response) => {
    const user = currentUser(request);
    const own = await requireAccess(context.dataSource, user.id, request.params.studioId, 'manageMembers');
    const invitation = await sendInvitation(await pendingInvitation(own.studioId, request.params.invitationId), user, response);
    response.json({ invitation: invitationView(invitation) });
  });

  router.delete('/studios/:studioId/invitations/:invitationId', async (request, response) => {
    const own = await requireAccess(context.dataSource, currentUser(request).id, request.params.studioId, 'manageMembers');
    const invitation = await pendingInvitation(own.studioId, request.params.invitationId);
    await invitations().update({ id: invitation.id }, { revokedAt: context.clock() });
    response.status(204).end();
  });

  /** Finds a usable invitation by its token: unknown and revoked answer 404, used and expired 409. */
  async function invitationByToken(token: string): Promise<Invitation> {
    const invitation = await invitations().findOneBy({ tokenHash: hashSecretToken(token) });
    if (!invitation || invitation.revokedAt) throw notFound('Invitation');
    if (invitation.acceptedAt) throw conflict('This invitation has already been used', 'token');
    if (invitation.expiresAt.getTime() <= context.clock().getTime()) throw conflict('This invitation has expired; ask the studio lead to send a new one', 'token');
    return invitation;
  }

  // Public: what the accept page shows before anyone signs in.
  router.get('/invitations/:token', async (request, response) => {
    const invitation = await invitationByToken(request.params.token);
    const studio = await context.dataSource.getRepository(Studio).findOneByOrFail({ id: invitation.studioId });
    const hasAccount = await context.dataSource.getRepository(User).existsBy({ email: invitation.email });
    response.json({ invitation: { studioName: studio.name, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt.toISOString(), hasAccount } });
  });

  router.post('/invitations/accept', async (request, response) => {
    const body = parseInput(acceptInvitationBody, request.body);
    const invitation = await invitationByToken(body.token);
    const signedIn = await userFromRequest(context, request);
    let user = await context.dataSource.getRepository(User).findOneBy({ email: invitation.email });
    if (user && signedIn?.user.id !== user.id) {
      throw new ApiError(401, 'unauthenticated', `Sign in as ${invitation.email} to accept this invitation`);
    }
    let passwordHash: string | null = null;
    if (!user) {
      const missing = [
        ...(body.displayName ? [] : [fieldIssue(['displayName'], 'is required to create your account', undefined, false)]),
        ...(body.password ? [] : [fieldIssue(['password'], 'is required to create your account', undefined, false)]),
      ];
      if (missing.length > 0) throw invalidFields(missing);
      requireStrongPassword(body.password as string, invitation.email);
      passwordHash = await hashPassword(body.password as string, context.config.passwordHashCost);
    }
    user = await context.dataSource.transaction(async (manager) => {
      const claimed = await manager.update(Invitation, { id: invitation.id, acceptedAt: IsNull() }, { acceptedAt: context.clock() });
      if (claimed.affected !== 1) throw conflict('This invitation has already been used', 'token');
      const member =
        user ?? (await manager.save(User, manager.create(User, { email: invitation.email, displayName: body.displayName as string, passwordHash: passwordHash as string })));
      const already = await manager.getRepository(Membership).existsBy({ userId: member.id, studioId: invitation.studioId });
      if (!already) await manager.save(Membership, manager.create(Membership, { userId: member.id, studioId: invitation.studioId, role: invitation.role }));
      return member;
    });
    const token = issueAuthCookie(context, response, user);
    response.json({ token, user: userView(user), studioId: invitation.studioId, role: invitation.role });
  });

  return router;
}
