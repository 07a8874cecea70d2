import type { Role } from '../access/roles';
import type { Patch } from '../patch/patch-schema';

/** What the API answers, shape by shape; the client types its queries with these. */
export interface UserView {
  id: string;
  email: string;
  displayName: string;
  createdAt: string;
}

export interface StudioSummary {
  id: string;
  name: string;
  slug: string;
  role: Role;
  createdAt: string;
}

export interface MeResponse {
  user: UserView;
  studios: StudioSummary[];
}

export interface AuthResponse {
  token: string;
  user: UserView;
}

export interface MemberView {
  userId: string;
  email: string;
  displayName: string;
  role: Role;
  joinedAt: string;
  lastSeenAt: string | null;
}

export interface InvitationView {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  sentAt: string;
  acceptedAt: string | null;
}

export interface InvitationPreview {
  studioName: string;
  email: string;
  role: Role;
  expiresAt: string;
  hasAccount: boolean;
}

export interface PersonRef {
  id: string;
  displayName: string | null;
}

export interface SessionSummary {
  id: string;
  studioId: string;
  name: string;
  archived: boolean;
  createdAt: string;
  updatedAt: string;
  createdBy: PersonRef | null;
  updatedBy: PersonRef | null;
}

export interface SessionDetail extends SessionSummary {
  patch: Patch;
  /** The preset the session was started from, loaded from or saved as, while it exists in the studio. */
  sourcePreset: SourcePresetRef | null;
}

/** A preset a session came from: what "Update preset" writes to. */
export interface SourcePresetRef {
  id: string;
  name: string;
  version: number;
}

export interface PresetSummary {
  id: string;
  studioId: string;
  name: string;
  tags: string[];
  description: string;
  version: number;
  createdAt: string;
  updatedAt: string;
  author: PersonRef | null;
}

export interface PresetDetail extends PresetSummary {
  patch: Patch;
}

export interface MailboxMessageView {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  links: string[];
  receivedAt: string;
}
