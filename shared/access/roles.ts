/** The four roles a member can hold in a studio. */
export const ROLES = ['lead', 'designer', 'producer', 'listener'] as const;
export type Role = (typeof ROLES)[number];

/** What a member may do. Every route checks one of these on the server; the client only hides buttons. */
export const ACTIONS = ['view', 'editSessions', 'deleteSessions', 'managePresets', 'exportRenders', 'deleteRenders', 'manageMembers'] as const;
export type Action = (typeof ACTIONS)[number];

/** The permission matrix, role by role. */
export const PERMISSIONS: Readonly<Record<Role, ReadonlySet<Action>>> = {
  lead: new Set<Action>(['view', 'editSessions', 'deleteSessions', 'managePresets', 'exportRenders', 'deleteRenders', 'manageMembers']),
  designer: new Set<Action>(['view', 'editSessions']),
  producer: new Set<Action>(['view', 'exportRenders']),
  listener: new Set<Action>(['view']),
};

export function can(role: Role, action: Action): boolean {
  return PERMISSIONS[role].has(action);
}

/** Why a role may not take an action, for messages and disabled buttons. */
export const ACTION_REASONS: Readonly<Record<Action, string>> = {
  view: 'only members of the studio can see it',
  editSessions: 'only leads and designers can create or edit sessions',
  deleteSessions: 'only leads can delete sessions',
  managePresets: 'only leads can save, edit or delete presets',
  exportRenders: 'only leads and producers can export renders',
  deleteRenders: 'only leads can delete renders',
  manageMembers: 'only leads can invite, change roles or remove members',
};
