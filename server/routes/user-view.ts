import type { User } from '../db/entities/user';

/** What the API shows of a user: never the password hash or token version. */
export function userView(user: User) {
  return { id: user.id, email: user.email, displayName: user.displayName, createdAt: user.createdAt.toISOString() };
}
