import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A session remembers the preset it was started from, loaded from or saved as (for "Update preset"). */
export class SessionSourcePreset1764670000000 implements MigrationInterface {
  name = 'SessionSourcePreset1764670000000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`ALTER TABLE "sessions" ADD COLUMN "sourcePresetId" varchar`);
  }

  async down(runner: QueryRunner): Promise<void> {
    await runner.query(`ALTER TABLE "sessions" DROP COLUMN "sourcePresetId"`);
  }
}
