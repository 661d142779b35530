import type { MigrationInterface, QueryRunner } from 'typeorm';
import { viewOf } from '../../datasets/dataset-view.js';
import { readSnapshot } from '../../datasets/snapshot.js';

const TABLE = `CREATE TABLE "dataset_view" ("dataset_id" varchar PRIMARY KEY NOT NULL, "summary" text NOT NULL, "checks" text NOT NULL, CONSTRAINT "FK_35d98421d02a85cc058e64baa35" FOREIGN KEY ("dataset_id") REFERENCES "dataset" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`;

/**
 * What the dataset page and the lock checks read of a snapshot moves beside it
 * (`dataset_view`), so no request parses a snapshot on the main thread. Existing datasets get
 * theirs from their snapshot here; their own rows (locked ones included) are not touched.
 */
export class DatasetViews1796350000000 implements MigrationInterface {
  name = 'DatasetViews1796350000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(TABLE);
    const ids: Array<{ id: string }> = await queryRunner.query('SELECT "id" FROM "dataset"');
    for (const { id } of ids) {
      const [{ snapshot }] = (await queryRunner.query(
        'SELECT "snapshot" FROM "dataset" WHERE "id" = ?',
        [id],
      )) as Array<{ snapshot: string }>;
      const view = viewOf(readSnapshot(snapshot!));
      await queryRunner.query(
        'INSERT INTO "dataset_view" ("dataset_id", "summary", "checks") VALUES (?, ?, ?)',
        [id, JSON.stringify(view.summary), JSON.stringify(view.checks)],
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE "dataset_view"');
  }
}
