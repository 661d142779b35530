import type { MigrationInterface, QueryRunner } from 'typeorm';
import { isNumericTable } from '../../references/reference-parse.js';

/**
 * A reference table's size, row count and kind move into columns (`size_bytes`, `row_count`,
 * `numeric`), so lists and the upload quotas never read its bytes or rows. Existing tables get
 * them from what they hold.
 */
export class ReferenceFacts1796330000000 implements MigrationInterface {
  name = 'ReferenceFacts1796330000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const add = (column: string) =>
      queryRunner.query(`ALTER TABLE "reference_table" ADD COLUMN ${column}`);
    await add(`"size_bytes" integer NOT NULL DEFAULT (0)`);
    await add(`"row_count" integer NOT NULL DEFAULT (0)`);
    await add(`"numeric" boolean NOT NULL DEFAULT (0)`);
    await queryRunner.query(
      `UPDATE "reference_table" SET "size_bytes" = length("file_bytes"), "row_count" = json_array_length("rows")`,
    );
    const tables: Array<{ id: string; rows: string }> = await queryRunner.query(
      'SELECT "id", "rows" FROM "reference_table"',
    );
    for (const table of tables) {
      const numeric = isNumericTable(JSON.parse(table.rows) as Array<{ value: string }>);
      if (numeric) {
        await queryRunner.query('UPDATE "reference_table" SET "numeric" = 1 WHERE "id" = ?', [
          table.id,
        ]);
      }
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const column of ['numeric', 'row_count', 'size_bytes']) {
      await queryRunner.query(`ALTER TABLE "reference_table" DROP COLUMN "${column}"`);
    }
  }
}
