import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The Z_L a reference table's rows imply, stored with each comparison
 * (`comparison.implied_weights`, JSON; null for grand and numeric comparisons and for those
 * stored before).
 */
export class ComparisonImpliedWeights1796340000000 implements MigrationInterface {
  name = 'ComparisonImpliedWeights1796340000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "comparison" ADD COLUMN "implied_weights" text`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "comparison" DROP COLUMN "implied_weights"`);
  }
}
