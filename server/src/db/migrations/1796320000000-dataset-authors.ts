import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The citation's authors of a dataset, chosen before the lock (`dataset.authors`, a JSON list of
 * user ids; null keeps the default list). Existing rows keep null, so locked rows are not
 * touched (their triggers refuse updates) and their documents keep their hash.
 */
export class DatasetAuthors1796320000000 implements MigrationInterface {
  name = 'DatasetAuthors1796320000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "dataset" ADD COLUMN "authors" text`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "dataset" DROP COLUMN "authors"`);
  }
}
