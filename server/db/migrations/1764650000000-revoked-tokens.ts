import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Signed-out tokens, refused until their expiry. */
export class RevokedTokens1764650000000 implements MigrationInterface {
  name = 'RevokedTokens1764650000000';

  async up(runner: QueryRunner): Promise<void> {
    await runner.query(`CREATE TABLE "revoked_tokens" (
      "jti" varchar PRIMARY KEY NOT NULL,
      "userId" varchar NOT NULL,
      "expiresAt" datetime NOT NULL,
      "revokedAt" datetime NOT NULL
    )`);
    await runner.query(`CREATE INDEX "revoked_tokens_expires" ON "revoked_tokens" ("expiresAt")`);
  }

  async down(runner: QueryRunner): Promise<void> {
    await runner.query(`DROP TABLE "revoked_tokens"`);
  }
}
