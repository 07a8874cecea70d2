import type { DataSource } from 'typeorm';
import { can, type Action } from '../../shared/access/roles';
import { Membership } from '../db/entities/membership';
import { forbidden, notFound } from '../http/api-error';

/**
 * The caller's membership of a studio. Every studio-scoped lookup goes through here: a studio the
 * caller does not belong to answers 404 exactly like one that does not exist.
 */
export async function requireMembership(dataSource: DataSource, userId: string, studioId: string, what = 'Studio'): Promise<Membership> {
  const membership = await dataSource.getRepository(Membership).findOneBy({ userId, studioId });
  if (!membership) throw notFound(what);
  return membership;
}

/** 403 with the reason when the member's role may not take the action. */
export function requirePermission(membership: Membership, action: Action): void {
  if (!can(membership.role, action)) throw forbidden(action);
}

/** Membership plus permission in one step. */
export async function requireAccess(dataSource: DataSource, userId: string, studioId: string, action: Action, what?: string): Promise<Membership> {
  const membership = await requireMembership(dataSource, userId, studioId, what);
  requirePermission(membership, action);
  return membership;
}
