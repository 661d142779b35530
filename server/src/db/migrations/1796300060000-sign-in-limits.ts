import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The rate-limit counters of sign-in (per address, global, per-account backoff). */
export class SignInLimits1796300060000 implements MigrationInterface {
  name = 'SignInLimits1796300060000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "rate_limit" ("key" varchar(300) PRIMARY KEY NOT NULL, "hits" integer NOT NULL, "reset_at" integer NOT NULL, "updated_at" integer NOT NULL)`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "rate_limit"`);
  }
}
