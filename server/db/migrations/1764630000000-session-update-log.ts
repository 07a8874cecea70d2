import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The append-only log of collaborative document updates, per session. */
export class SessionUpdateLog1764630000000 implements MigrationInterface {
  name = 'SessionUpdateLog1764630000000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`CREATE TABLE "session_updates" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "sessionId" varchar NOT NULL REFERENCES "sessions" ("id") ON DELETE CASCADE,
      "update" blob NOT NULL,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now'))
    )`);
    await runner.query(`CREATE INDEX "session_updates_session" ON "session_updates" ("sessionId", "id")`);
  }

  async down(runner: QueryRunner): Promise<void> {
    await runner.query(`DROP TABLE "session_updates"`);
  }
}
