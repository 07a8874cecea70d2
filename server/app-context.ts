import type { DataSource } from 'typeorm';
import type { Mailer } from './mail/mailer';
import type { FakeMailbox } from './mail/fake-smtp-server';
import type { CollabHub } from './collab/collab-hub';
import type { RenderService } from './renders/render-service';
import type { AccessEvents } from './access/access-events';

export interface ServerConfig {
  /** Where links in e-mails point, e.g. http://localhost:3000. */
  appUrl: string;
  jwtSecret: string;
  tokenLifetimeS: number;
  /** log2 of scrypt's N. */
  passwordHashCost: number;
  invitationLifetimeS: number;
  passwordResetLifetimeS: number;
  /** Requests per window on sign-in, register and reset, per client address. */
  authRateLimit: { windowMs: number; limit: number };
  /** Secure cookies (HTTPS only) in production behind TLS. */
  secureCookies: boolean;
  /** Where render files are written (data/renders by default). */
  rendersDir: string;
  /** Render storage per studio, bytes. */
  renderQuotaBytes: number;
  /** Origins besides APP_URL's own that may send changes and open live connections (ALLOWED_ORIGINS). */
  allowedOrigins?: string[];
  /** DEV_MAILBOX_REMOTE=true: the local mailbox answers other machines too (a demo opt-in; never in production). */
  mailboxRemote?: boolean;
  /**
   * The local mailbox is not served at all: the server listens on an address other machines can
   * reach (HOST not loopback) and DEV_MAILBOX_REMOTE is not set. Mail still goes to it, unread.
   */
  mailboxOff?: boolean;
  /** Per-account limits (sign-in failures, password checks, invitation mails); defaults in LIMITS. */
  accountRateLimits?: Partial<AccountRateLimits>;
}

/** A fixed-window limit: at most `limit` counted attempts per `windowS` seconds for one key. */
export interface WindowLimit {
  windowS: number;
  limit: number;
}

export interface AccountRateLimits {
  /** Failed sign-ins per e-mail address (normalised). */
  signInFailures: WindowLimit;
  /** Wrong current passwords per account (password change, account deletion). */
  passwordChecks: WindowLimit;
  /** Invitation e-mails per studio and address (new, repeated and resent invitations). */
  invitationMails: WindowLimit;
}

/** What every route receives: the database, the settings, the mail sender and (locally) the mailbox. */
export interface AppContext {
  dataSource: DataSource;
  config: ServerConfig;
  mailer: Mailer;
  mailbox: FakeMailbox | null;
  clock: () => Date;
  /** Access changes (roles, removals, archive, password, sign-out) reaching open live connections. */
  access: AccessEvents;
  log: (line: string) => void;
  /** The live documents, when the HTTP server runs the collaboration endpoint. */
  collab?: CollabHub;
  /** Render jobs and their files (created with the app). */
  renders?: RenderService;
}
