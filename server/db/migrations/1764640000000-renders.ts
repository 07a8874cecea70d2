import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Render jobs and the files they made. */
export class Renders1764640000000 implements MigrationInterface {
  name = 'Renders1764640000000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`CREATE TABLE "renders" (
      "id" varchar PRIMARY KEY NOT NULL,
      "studioId" varchar NOT NULL REFERENCES "studios" ("id") ON DELETE CASCADE,
      "kind" varchar NOT NULL,
      "name" varchar NOT NULL,
      "state" varchar NOT NULL,
      "progressPercent" integer NOT NULL DEFAULT (0),
      "sourceKind" varchar NOT NULL,
      "sourceId" varchar NOT NULL,
      "sourceName" varchar NOT NULL,
      "sessionId" varchar,
      "output" text NOT NULL,
      "noteSet" text,
      "patch" text NOT NULL,
      "fileName" varchar,
      "sizeBytes" integer,
      "estimatedBytes" integer NOT NULL DEFAULT (0),
      "durationS" real,
      "peakDbfs" real,
      "truePeakDbtp" real,
      "integratedLufs" real,
      "fileCount" integer,
      "error" varchar,
      "createdById" varchar REFERENCES "users" ("id") ON DELETE SET NULL,
      "createdAt" datetime NOT NULL DEFAULT (datetime('now')),
      "finishedAt" datetime
    )`);
    await runner.query(`CREATE INDEX "renders_studio_created" ON "renders" ("studioId", "createdAt")`);
  }

  async down(runner: QueryRunner): Promise<void> {
    await runner.query(`DROP TABLE "renders"`);
  }
}
