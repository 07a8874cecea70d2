import type { DataSource, EntityManager } from 'typeorm';
import { Membership } from '../db/entities/membership';
import { Studio } from '../db/entities/studio';
import { User } from '../db/entities/user';

/** Raw SQLite datetimes ('YYYY-MM-DD HH:MM:SS', UTC) as ISO 8601 strings, as the rest of the API answers. */
function isoFromSqlite(value: string | null): string | null {
  return value === null ? null : new Date(`${value.replace(' ', 'T')}Z`).toISOString();
}

/** The studios a user belongs to, with the user's role in each, by name. */
export async function studiosOf(dataSource: DataSource, userId: string) {
  const rows = await dataSource
    .getRepository(Membership)
    .createQueryBuilder('m')
    .innerJoin(Studio, 's', 's.id = m.studioId')
    .select(['s.id AS id', 's.name AS name', 's.slug AS slug', 'm.role AS role', 's.createdAt AS createdAt'])
    .where('m.userId = :userId', { userId })
    .orderBy('s.name', 'ASC')
    .getRawMany<{ id: string; name: string; slug: string; role: string; createdAt: string }>();
  return rows.map((row) => ({ ...row, createdAt: isoFromSqlite(row.createdAt) }));
}

/** Members of a studio with their names and e-mail addresses. */
export async function membersOf(dataSource: DataSource, studioId: string) {
  const rows = await dataSource
    .getRepository(Membership)
    .createQueryBuilder('m')
    .innerJoin(User, 'u', 'u.id = m.userId')
    .select(['u.id AS userId', 'u.email AS email', 'u.displayName AS displayName', 'm.role AS role', 'm.createdAt AS joinedAt', 'u.lastSeenAt AS lastSeenAt'])
    .where('m.studioId = :studioId', { studioId })
    .orderBy('u.displayName', 'ASC')
    .getRawMany<{ userId: string; email: string; displayName: string; role: string; joinedAt: string; lastSeenAt: string | null }>();
  return rows.map((row) => ({ ...row, joinedAt: isoFromSqlite(row.joinedAt), lastSeenAt: isoFromSqlite(row.lastSeenAt) }));
}

export function leadCount(manager: EntityManager | DataSource, studioId: string): Promise<number> {
  return manager.getRepository(Membership).countBy({ studioId, role: 'lead' });
}
