import type { Role } from '../../../shared/access/roles';

export const ROLE_NAMES: Readonly<Record<Role, string>> = { lead: 'Lead', designer: 'Designer', producer: 'Producer', listener: 'Listener' };

/** What each role may do in a studio, in a sentence (the matrix is in shared/access/roles.ts). */
export const ROLE_SUMMARIES: Readonly<Record<Role, string>> = {
  lead: 'Manages members and presets, and creates, edits and deletes sessions.',
  designer: 'Creates and edits sessions.',
  producer: 'Listens, auditions and exports renders.',
  listener: 'Listens and auditions.',
};

/** The reason the only lead's role and removal controls are locked (the server's words for the same rule). */
export const LAST_LEAD_REASON = 'A studio keeps at least one lead: make another member lead first';
