import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A render's row says when its level is not what was asked for (true-peak ceiling, too short for loudness). */
export class RenderLevellingNote1764660000000 implements MigrationInterface {
  name = 'RenderLevellingNote1764660000000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`ALTER TABLE "renders" ADD COLUMN "levellingNote" varchar`);
  }

  async down(runner: QueryRunner): Promise<void> {
    await runner.query(`ALTER TABLE "renders" DROP COLUMN "levellingNote"`);
  }
}
