import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The two columns that can hold tens of megabytes each, in this order. */
const BYTE_COLUMNS = ['"snapshot" text NOT NULL', '"canonical" text'] as const;

/** `CREATE TABLE "dataset" (...)` with the byte columns last, the constraints unchanged. */
function bytesLast(createSql: string): string {
  let sql = createSql;
  for (const column of BYTE_COLUMNS) {
    const next = sql.replace(`, ${column}`, '');
    if (next === sql) throw new Error(`dataset table: column ${column} not found as expected`);
    sql = next;
  }
  const cut = sql.indexOf(', CONSTRAINT ');
  if (cut < 0) throw new Error('dataset table: its constraints were not found as expected');
  return `${sql.slice(0, cut)}, ${BYTE_COLUMNS.join(', ')}${sql.slice(cut)}`;
}

/**
 * Rebuilds "dataset" with its byte columns last (SQLite cannot move a column): a new
 * table, every row copied as it is (locked rows keep their bytes and so their hash), the old one
 * dropped, the new one renamed, its indexes and triggers made again from their stored text.
 * TypeORM runs migrations with foreign keys off, so dropping the old table deletes no review,
 * comment, waiver or view row; this is checked before anything is changed.
 */
async function rebuild(queryRunner: QueryRunner): Promise<void> {
  const [{ foreign_keys: foreignKeys }] = (await queryRunner.query(
    'PRAGMA foreign_keys',
  )) as Array<{
    foreign_keys: number;
  }>;
  if (foreignKeys !== 0) {
    throw new Error('dataset table rebuild needs foreign keys off (dependent rows would go)');
  }
  const [{ sql }] = (await queryRunner.query(
    `SELECT "sql" FROM "sqlite_master" WHERE "type" = 'table' AND "name" = 'dataset'`,
  )) as Array<{ sql: string }>;
  const attached = (await queryRunner.query(
    `SELECT "sql" FROM "sqlite_master" WHERE "tbl_name" = 'dataset' AND "type" IN ('index', 'trigger') AND "sql" IS NOT NULL`,
  )) as Array<{ sql: string }>;
  const columns = (
    (await queryRunner.query(`PRAGMA table_info("dataset")`)) as Array<{
      name: string;
    }>
  )
    .map((c) => `"${c.name}"`)
    .join(', ');
  const [{ n: before }] = await queryRunner.query(`SELECT count(*) AS "n" FROM "dataset"`);
  const create = bytesLast(sql).replace(
    /^CREATE TABLE "dataset"/,
    'CREATE TABLE "dataset_rebuilt"',
  );
  await queryRunner.query(create);
  await queryRunner.query(
    `INSERT INTO "dataset_rebuilt" (${columns}) SELECT ${columns} FROM "dataset"`,
  );
  await queryRunner.query(`DROP TABLE "dataset"`);
  // Legacy renaming: the child tables' triggers name "dataset", which does not exist until the
  // rename is done; the modern rename would re-check them and refuse.
  await queryRunner.query('PRAGMA legacy_alter_table = ON');
  await queryRunner.query(`ALTER TABLE "dataset_rebuilt" RENAME TO "dataset"`);
  await queryRunner.query('PRAGMA legacy_alter_table = OFF');
  for (const { sql: statement } of attached) await queryRunner.query(statement);
  const [{ n: after }] = await queryRunner.query(`SELECT count(*) AS "n" FROM "dataset"`);
  const broken = await queryRunner.query('PRAGMA foreign_key_check');
  if (after !== before || broken.length > 0) {
    throw new Error(`dataset table rebuild: ${before} rows before, ${after} after`);
  }
}

/**
 * The snapshot and canonical text move to the end of the dataset row. SQLite keeps a row's
 * columns in order and a large value spills into a chain of overflow pages, so reading any
 * column stored after a 60 MB snapshot (hash, dates, author, study, run) walked that whole chain
 * on the main thread: about 30 ms per read, 60-70 ms per dataset page. Placed last, they are
 * read only when asked for (exports, lock, verify).
 */
export class DatasetBytesLast1796360000000 implements MigrationInterface {
  name = 'DatasetBytesLast1796360000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await rebuild(queryRunner);
  }

  /**
   * Nothing to undo: the earlier schema differs only in where the columns stand, which no
   * earlier code depends on. (A rebuild here would not be safe: TypeORM reverts inside a
   * transaction, where SQLite cannot turn foreign keys off, so dropping the table would delete
   * the dependent rows.) Running `up` again moves nothing that is already last.
   */
  async down(): Promise<void> {}
}
