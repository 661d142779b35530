import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLES: ReadonlyArray<[name: string, definition: string]> = [
  [
    'dataset',
    `("id" varchar PRIMARY KEY NOT NULL, "version" integer NOT NULL, "title" varchar(200) NOT NULL, "description" text NOT NULL DEFAULT (''), "state" varchar(16) NOT NULL, "snapshot" text NOT NULL, "hash" varchar(64), "canonical" text, "locked_at" varchar(30), "created_at" varchar(30) NOT NULL, "updated_at" varchar(30) NOT NULL, "study_id" varchar NOT NULL, "run_id" varchar NOT NULL, "supersedes_id" varchar, "locked_by_id" varchar, "created_by_id" varchar NOT NULL, CONSTRAINT "FK_1d5834172bbe17e041ea3eca239" FOREIGN KEY ("study_id") REFERENCES "study" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_80da7cf4ba65005d6154b355484" FOREIGN KEY ("run_id") REFERENCES "run" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_e347cc5e95c5f36bf1c22835d81" FOREIGN KEY ("supersedes_id") REFERENCES "dataset" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_12e760b146ad9c10e9b10be7eea" FOREIGN KEY ("locked_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_5e42c77ce0a8da49bd944f227c5" FOREIGN KEY ("created_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'dataset_review_request',
    `("id" varchar PRIMARY KEY NOT NULL, "created_at" varchar(30) NOT NULL, "dataset_id" varchar NOT NULL, "reviewer_id" varchar NOT NULL, "requested_by_id" varchar NOT NULL, CONSTRAINT "UQ_dataset_review_request" UNIQUE ("dataset_id", "reviewer_id"), CONSTRAINT "FK_18cc4abc9a525e63ba6cb101f1f" FOREIGN KEY ("dataset_id") REFERENCES "dataset" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_ca7ac2199830d519e1a48871a88" FOREIGN KEY ("reviewer_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_529fcdacf270e775a38242b712c" FOREIGN KEY ("requested_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'dataset_review',
    `("id" varchar PRIMARY KEY NOT NULL, "verdict" varchar(16) NOT NULL, "comment" text NOT NULL DEFAULT (''), "created_at" varchar(30) NOT NULL, "dataset_id" varchar NOT NULL, "reviewer_id" varchar NOT NULL, CONSTRAINT "FK_586601fa81e533f1794e86d3686" FOREIGN KEY ("dataset_id") REFERENCES "dataset" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_cb7bf7ed855d0d4d8dfc3106ce2" FOREIGN KEY ("reviewer_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'dataset_comment',
    `("id" varchar PRIMARY KEY NOT NULL, "row_n" integer, "body" text NOT NULL, "created_at" varchar(30) NOT NULL, "dataset_id" varchar NOT NULL, "author_id" varchar NOT NULL, CONSTRAINT "FK_bb8d6aa538449617568305dec82" FOREIGN KEY ("dataset_id") REFERENCES "dataset" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_fe22825a5036e2af5ba9298cbf5" FOREIGN KEY ("author_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'dataset_waiver',
    `("id" varchar PRIMARY KEY NOT NULL, "check_key" varchar(64) NOT NULL, "row_n" integer, "reason" text NOT NULL, "created_at" varchar(30) NOT NULL, "dataset_id" varchar NOT NULL, "waived_by_id" varchar NOT NULL, CONSTRAINT "FK_b1891eca7de1350442cd8416027" FOREIGN KEY ("dataset_id") REFERENCES "dataset" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_33e57a135c11c25e2aebc984891" FOREIGN KEY ("waived_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
];

const INDEXES: ReadonlyArray<[name: string, definition: string]> = [
  ['IDX_dataset_hash', `"dataset" ("hash")`],
  ['IDX_dataset_study', `"dataset" ("study_id")`],
  ['IDX_dataset_review_dataset', `"dataset_review" ("dataset_id")`],
  ['IDX_dataset_comment_dataset', `"dataset_comment" ("dataset_id")`],
  ['IDX_dataset_waiver_dataset', `"dataset_waiver" ("dataset_id")`],
];

/** The message every refusal carries; the server maps it to 409 `dataset_locked`. */
export const LOCKED_MESSAGE = 'dataset_locked';

const CHILD_TABLES = [
  'dataset_review_request',
  'dataset_review',
  'dataset_comment',
  'dataset_waiver',
];

function childTriggers(table: string): Array<[name: string, definition: string]> {
  const lockedBy = (row: 'NEW' | 'OLD') =>
    `(SELECT "state" FROM "dataset" WHERE "id" = ${row}."dataset_id") = 'locked'`;
  const refuse = `BEGIN SELECT RAISE(ABORT, '${LOCKED_MESSAGE}'); END`;
  return [
    [`TR_${table}_locked_insert`, `BEFORE INSERT ON "${table}" WHEN ${lockedBy('NEW')} ${refuse}`],
    [
      `TR_${table}_locked_update`,
      `BEFORE UPDATE ON "${table}" WHEN ${lockedBy('OLD')} OR ${lockedBy('NEW')} ${refuse}`,
    ],
    [`TR_${table}_locked_delete`, `BEFORE DELETE ON "${table}" WHEN ${lockedBy('OLD')} ${refuse}`],
  ];
}

/**
 * The triggers that make a locked dataset immutable inside SQLite itself, whoever writes: no
 * UPDATE or DELETE of a locked dataset row, no insert, update or delete of its review requests,
 * reviews, comments and waivers; and no row reaches `locked` without its hash and canonical text.
 */
const TRIGGERS: ReadonlyArray<[name: string, definition: string]> = [
  [
    'TR_dataset_locked_update',
    `BEFORE UPDATE ON "dataset" WHEN OLD."state" = 'locked' BEGIN SELECT RAISE(ABORT, '${LOCKED_MESSAGE}'); END`,
  ],
  [
    'TR_dataset_locked_delete',
    `BEFORE DELETE ON "dataset" WHEN OLD."state" = 'locked' BEGIN SELECT RAISE(ABORT, '${LOCKED_MESSAGE}'); END`,
  ],
  [
    'TR_dataset_lock_needs_hash',
    `BEFORE UPDATE ON "dataset" WHEN NEW."state" = 'locked' AND (NEW."hash" IS NULL OR NEW."canonical" IS NULL) BEGIN SELECT RAISE(ABORT, 'a locked dataset needs its hash and canonical text'); END`,
  ],
  [
    'TR_dataset_insert_unlocked',
    `BEFORE INSERT ON "dataset" WHEN NEW."state" = 'locked' BEGIN SELECT RAISE(ABORT, 'a dataset is created as a draft'); END`,
  ],
  ...CHILD_TABLES.flatMap(childTriggers),
];

/**
 * Datasets (snapshots of finished runs), their review requests, reviews, row comments and check
 * waivers, and the triggers that freeze a locked dataset. `down` drops only these, so the rows
 * of earlier tables survive it.
 */
export class Datasets1764792000000 implements MigrationInterface {
  name = 'Datasets1764792000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [name, definition] of TABLES) {
      await queryRunner.query(`CREATE TABLE "${name}" ${definition}`);
    }
    for (const [name, definition] of INDEXES) {
      await queryRunner.query(`CREATE INDEX "${name}" ON ${definition}`);
    }
    for (const [name, definition] of TRIGGERS) {
      await queryRunner.query(`CREATE TRIGGER "${name}" ${definition}`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [name] of TRIGGERS) await queryRunner.query(`DROP TRIGGER "${name}"`);
    for (const [name] of INDEXES) await queryRunner.query(`DROP INDEX "${name}"`);
    for (const [name] of [...TABLES].reverse()) await queryRunner.query(`DROP TABLE "${name}"`);
  }
}
