import 'reflect-metadata';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource } from 'typeorm';
import { Invitation } from './entities/invitation';
import { Membership } from './entities/membership';
import { PasswordReset } from './entities/password-reset';
import { RevokedToken } from './entities/revoked-token';
import { Preset } from './entities/preset';
import { Render } from './entities/render';
import { Session } from './entities/session';
import { SessionUpdate } from './entities/session-update';
import { Studio } from './entities/studio';
import { User } from './entities/user';
import { InitialSchema1764626400000 } from './migrations/1764626400000-initial-schema';
import { SessionUpdateLog1764630000000 } from './migrations/1764630000000-session-update-log';
import { Renders1764640000000 } from './migrations/1764640000000-renders';
import { RenderLevellingNote1764660000000 } from './migrations/1764660000000-render-levelling-note';
import { RevokedTokens1764650000000 } from './migrations/1764650000000-revoked-tokens';
import { SessionSourcePreset1764670000000 } from './migrations/1764670000000-session-source-preset';

export const ENTITIES = [User, Studio, Membership, Invitation, PasswordReset, Session, Preset, SessionUpdate, Render, RevokedToken];
export const MIGRATIONS = [InitialSchema1764626400000, SessionUpdateLog1764630000000, Renders1764640000000, RevokedTokens1764650000000, RenderLevellingNote1764660000000, SessionSourcePreset1764670000000];

/**
 * The SQLite database through TypeORM (better-sqlite3): WAL journal, foreign keys on, schema from
 * migrations only. Entity and migration classes are passed directly (globs fail under vitest).
 */
export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ':memory:') mkdirSync(dirname(databasePath), { recursive: true });
  return new DataSource({
    type: 'better-sqlite3',
    database: databasePath,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    enableWAL: true,
    prepareDatabase: (db: { pragma: (statement: string) => unknown }) => {
      db.pragma('foreign_keys = ON');
      db.pragma('synchronous = NORMAL');
      db.pragma('busy_timeout = 5000');
    },
  });
}

/** Opens the database and brings its schema up to date. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return dataSource;
}
