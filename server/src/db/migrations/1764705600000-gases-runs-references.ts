import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLES: ReadonlyArray<[name: string, definition: string]> = [
  [
    'gas',
    `("id" varchar PRIMARY KEY NOT NULL, "title" varchar(200) NOT NULL, "current_version" integer NOT NULL, "deleted" boolean NOT NULL DEFAULT (0), "created_at" varchar(30) NOT NULL, "updated_at" varchar(30) NOT NULL, "study_id" varchar NOT NULL, "updated_by_id" varchar NOT NULL, CONSTRAINT "FK_4a56ac9d9e62012bbea9e97cf84" FOREIGN KEY ("study_id") REFERENCES "study" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_42917f36539f98057c17c920bb9" FOREIGN KEY ("updated_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'gas_version',
    `("id" varchar PRIMARY KEY NOT NULL, "version" integer NOT NULL, "spec" text NOT NULL, "created_at" varchar(30) NOT NULL, "gas_id" varchar NOT NULL, "created_by_id" varchar NOT NULL, CONSTRAINT "UQ_gas_version_number" UNIQUE ("gas_id", "version"), CONSTRAINT "FK_189c4f41dc11ce5d0201c63cd3f" FOREIGN KEY ("gas_id") REFERENCES "gas" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_a1c782a731b85ea3cf4f9eaa5cd" FOREIGN KEY ("created_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'run',
    `("id" varchar PRIMARY KEY NOT NULL, "status" varchar(16) NOT NULL, "progress_done" integer NOT NULL DEFAULT (0), "progress_total" integer NOT NULL DEFAULT (0), "progress_phase" varchar(32) NOT NULL DEFAULT (''), "result" blob, "class_counts" text, "requeues" integer NOT NULL DEFAULT (0), "started_at" varchar(30), "finished_at" varchar(30), "duration_ms" integer, "error" text, "created_at" varchar(30) NOT NULL, "gas_id" varchar NOT NULL, "gas_version_id" varchar NOT NULL, "created_by_id" varchar NOT NULL, CONSTRAINT "FK_23bfcb2729e0a0bec1e600d551f" FOREIGN KEY ("gas_id") REFERENCES "gas" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_f9ec8d2b1cff7bccc473f5e67cd" FOREIGN KEY ("gas_version_id") REFERENCES "gas_version" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_0ca99a5f141fa846b15cbeb69de" FOREIGN KEY ("created_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'reference_table',
    `("id" varchar PRIMARY KEY NOT NULL, "title" varchar(200) NOT NULL, "file_bytes" blob NOT NULL, "filename" varchar(255) NOT NULL, "content_type" varchar(100) NOT NULL, "sha256" varchar(64) NOT NULL, "rows" text NOT NULL, "normalization" text NOT NULL DEFAULT ('1'), "variable" varchar(1) NOT NULL DEFAULT ('q'), "note" text NOT NULL DEFAULT (''), "created_at" varchar(30) NOT NULL, "study_id" varchar NOT NULL, "created_by_id" varchar NOT NULL, CONSTRAINT "FK_deb5907ba6490549b171ce129b7" FOREIGN KEY ("study_id") REFERENCES "study" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_d651c277156925f2859efb81d6d" FOREIGN KEY ("created_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
  [
    'comparison',
    `("id" varchar PRIMARY KEY NOT NULL, "kind" varchar(16) NOT NULL, "normalization" text NOT NULL DEFAULT ('1'), "verdicts" text NOT NULL, "created_at" varchar(30) NOT NULL, "run_id" varchar NOT NULL, "reference_id" varchar, "created_by_id" varchar NOT NULL, CONSTRAINT "FK_919856b77e8bac4ddddec47d5b5" FOREIGN KEY ("run_id") REFERENCES "run" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_57231da01246502815a4b26049a" FOREIGN KEY ("reference_id") REFERENCES "reference_table" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_a9b114a0ec1450b9a9597a238f2" FOREIGN KEY ("created_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
  ],
];

const INDEXES: ReadonlyArray<[name: string, definition: string]> = [
  ['IDX_gas_study', `"gas" ("study_id")`],
  ['IDX_run_gas', `"run" ("gas_id")`],
  ['IDX_run_status', `"run" ("status")`],
  ['IDX_reference_table_study', `"reference_table" ("study_id")`],
  ['IDX_comparison_run', `"comparison" ("run_id")`],
];

/**
 * Gases with numbered versions, runs (result kept gzip-compressed), reference tables (the file
 * as uploaded) and comparisons. `down` drops only these tables, so foundation rows survive it.
 * Constraint names match what TypeORM derives from the entities (the schema builder sees no
 * difference; tested in gas-migration.spec.ts).
 */
export class GasesRunsReferences1764705600000 implements MigrationInterface {
  name = 'GasesRunsReferences1764705600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [name, definition] of TABLES) {
      await queryRunner.query(`CREATE TABLE "${name}" ${definition}`);
    }
    for (const [name, definition] of INDEXES) {
      await queryRunner.query(`CREATE INDEX "${name}" ON ${definition}`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [name] of INDEXES) await queryRunner.query(`DROP INDEX "${name}"`);
    for (const [name] of [...TABLES].reverse()) await queryRunner.query(`DROP TABLE "${name}"`);
  }
}
