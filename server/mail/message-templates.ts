import type { Role } from '../../shared/access/roles';
import type { OutgoingMail } from './mailer';

export function invitationMail(to: string, studioName: string, role: Role, inviterName: string, link: string, expiresAt: Date): OutgoingMail {
  return {
    to,
    subject: `${inviterName} invited you to ${studioName} on Tautline`,
    text: [
      `${inviterName} invited you to join the studio "${studioName}" on Tautline as a ${role}.`,
      '',
      `Accept the invitation: ${link}`,
      '',
      `The link works once and expires on ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
      'If you did not expect this, ignore this message.',
    ].join('\n'),
  };
}

export function passwordResetMail(to: string, link: string, expiresAt: Date): OutgoingMail {
  return {
    to,
    subject: 'Reset your Tautline password',
    text: [
      'Someone asked to reset the password of your Tautline account.',
      '',
      `Choose a new password: ${link}`,
      '',
      `The link works once and expires on ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
      'If it was not you, ignore this message; your password stays as it is.',
    ].join('\n'),
  };
}
