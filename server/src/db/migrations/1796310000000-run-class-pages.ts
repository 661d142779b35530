import { gunzipSync, gzipSync } from 'node:zlib';
import type { MigrationInterface, QueryRunner } from 'typeorm';
import { CLASS_PAGE_ROWS } from '../../runs/class-pager.js';

const TABLE = `CREATE TABLE "run_class_page" ("run_id" varchar NOT NULL, "n" integer NOT NULL, "page" integer NOT NULL, "row_count" integer NOT NULL, "rows" blob NOT NULL, CONSTRAINT "FK_8b667c020b1a4eb268c609474b1" FOREIGN KEY ("run_id") REFERENCES "run" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, PRIMARY KEY ("run_id", "n", "page"))`;

interface StoredResult {
  classes?: Array<{ N: number }>;
}

/**
 * Class rows move out of the run's result into pages (`run_class_page`), so answers read only
 * the rows they show. Existing finished runs are rewritten: their rows become pages and their
 * result keeps everything else. `down` puts the rows back into the result.
 */
export class RunClassPages1796310000000 implements MigrationInterface {
  name = 'RunClassPages1796310000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(TABLE);
    const runs: Array<{ id: string; result: Buffer }> = await queryRunner.query(
      'SELECT "id", "result" FROM "run" WHERE "result" IS NOT NULL',
    );
    for (const run of runs) {
      const { classes = [], ...rest } = JSON.parse(
        gunzipSync(run.result).toString('utf8'),
      ) as StoredResult;
      const byN = new Map<number, string[]>();
      for (const row of classes) byN.set(row.N, [...(byN.get(row.N) ?? []), JSON.stringify(row)]);
      for (const [n, texts] of byN) {
        for (let page = 0; page * CLASS_PAGE_ROWS < texts.length; page++) {
          const slice = texts.slice(page * CLASS_PAGE_ROWS, (page + 1) * CLASS_PAGE_ROWS);
          await queryRunner.query(
            'INSERT INTO "run_class_page" ("run_id", "n", "page", "row_count", "rows") VALUES (?, ?, ?, ?, ?)',
            [run.id, n, page, slice.length, gzipSync(`[${slice.join(',')}]`)],
          );
        }
      }
      await queryRunner.query('UPDATE "run" SET "result" = ? WHERE "id" = ?', [
        gzipSync(JSON.stringify(rest)),
        run.id,
      ]);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    const runs: Array<{ id: string; result: Buffer }> = await queryRunner.query(
      'SELECT "id", "result" FROM "run" WHERE "result" IS NOT NULL',
    );
    for (const run of runs) {
      const pages: Array<{ rows: Buffer }> = await queryRunner.query(
        'SELECT "rows" FROM "run_class_page" WHERE "run_id" = ? ORDER BY "n", "page"',
        [run.id],
      );
      const classes = pages.flatMap((p) => JSON.parse(gunzipSync(p.rows).toString('utf8')));
      const rest = JSON.parse(gunzipSync(run.result).toString('utf8')) as object;
      await queryRunner.query('UPDATE "run" SET "result" = ? WHERE "id" = ?', [
        gzipSync(JSON.stringify({ ...rest, classes })),
        run.id,
      ]);
    }
    await queryRunner.query('DROP TABLE "run_class_page"');
  }
}
