import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Users, studios, memberships, invitations, password resets, sessions and presets. */
export class InitialSchema1764626400000 implements MigrationInterface {
  name = 'InitialSchema1764626400000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`CREATE TABLE "users" (
      "id" varchar PRIMARY KEY NOT NULL,
      "email" varchar NOT NULL UNIQUE,
      "displayName" varchar NOT NULL,
      "passwordHash" varchar NOT NULL,
      "tokenVersion" integer NOT NULL DEFAULT (0),
      "createdAt" datetime NOT NULL DEFAULT (datetime('now')),
      "lastSeenAt" datetime
    )`);
    await runner.query(`CREATE TABLE "studios" (
      "id" varchar PRIMARY KEY NOT NULL,
      "name" varchar NOT NULL,
      "slug" varchar NOT NULL UNIQUE,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE TABLE "memberships" (
      "id" varchar PRIMARY KEY NOT NULL,
      "userId" varchar NOT NULL REFERENCES "users" ("id") ON DELETE CASCADE,
      "studioId" varchar NOT NULL REFERENCES "studios" ("id") ON DELETE CASCADE,
      "role" varchar NOT NULL CHECK ("role" IN ('lead', 'designer', 'producer', 'listener')),
      "createdAt" datetime NOT NULL DEFAULT (datetime('now')),
      UNIQUE ("userId", "studioId")
    )`);
    await runner.query(`CREATE INDEX "memberships_studio" ON "memberships" ("studioId")`);
    await runner.query(`CREATE TABLE "invitations" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studioId" varchar NOT NULL REFERENCES "studios" ("id") ON DELETE CASCADE,
      "email" varchar NOT NULL,
      "role" varchar NOT NULL CHECK ("role" IN ('lead', 'designer', 'producer', 'listener')),
      "tokenHash" varchar NOT NULL UNIQUE,
      "expiresAt" datetime NOT NULL,
      "acceptedAt" datetime,
      "revokedAt" datetime,
      "invitedById" varchar REFERENCES "users" ("id") ON DELETE SET NULL,
      "sentAt" datetime NOT NULL,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE INDEX "invitations_studio" ON "invitations" ("studioId")`);
    await runner.query(`CREATE TABLE "password_resets" (
      "id" varchar PRIMARY KEY NOT NULL,
      "userId" varchar NOT NULL REFERENCES "users" ("id") ON DELETE CASCADE,
      "tokenHash" varchar NOT NULL UNIQUE,
      "expiresAt" datetime NOT NULL,
      "usedAt" datetime,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE TABLE "sessions" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studioId" varchar NOT NULL REFERENCES "studios" ("id") ON DELETE CASCADE,
      "name" varchar NOT NULL,
      "patch" text NOT NULL,
      "docState" blob,
      "createdById" varchar REFERENCES "users" ("id") ON DELETE SET NULL,
      "updatedById" varchar REFERENCES "users" ("id") ON DELETE SET NULL,
      "archived" boolean NOT NULL DEFAULT (0),
      "createdAt" datetime NOT NULL DEFAULT (datetime('now')),
      "updatedAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE INDEX "sessions_studio" ON "sessions" ("studioId")`);
    await runner.query(`CREATE TABLE "presets" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studioId" varchar NOT NULL REFERENCES "studios" ("id") ON DELETE CASCADE,
      "name" varchar NOT NULL,
      "tags" text NOT NULL,
      "description" varchar NOT NULL DEFAULT (''),
      "patch" text NOT NULL,
      "version" integer NOT NULL DEFAULT (1),
      "createdById" varchar REFERENCES "users" ("id") ON DELETE SET NULL,
      "sourceSessionId" varchar REFERENCES "sessions" ("id") ON DELETE SET NULL,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now')),
      "updatedAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE INDEX "presets_studio" ON "presets" ("studioId")`);
  }

  async down(runner: QueryRunner): Promise<void> {
    for (const table of ['presets', 'sessions', 'password_resets', 'invitations', 'memberships', 'studios', 'users']) {
      await runner.query(`DROP TABLE "${table}"`);
    }
  }
}
