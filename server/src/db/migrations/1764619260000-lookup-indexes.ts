import type { MigrationInterface, QueryRunner } from 'typeorm';

const INDEXES: ReadonlyArray<[name: string, definition: string]> = [
  ['IDX_audit_event_target', `"audit_event" ("target_type", "target_id")`],
  ['IDX_study_owner', `"study" ("owner_id")`],
  ['IDX_study_member_user', `"study_member" ("user_id")`],
];

/** Indexes for the lookups every request makes: a user's studies, a target's audit trail. */
export class LookupIndexes1764619260000 implements MigrationInterface {
  name = 'LookupIndexes1764619260000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [name, definition] of INDEXES) {
      await queryRunner.query(`CREATE INDEX "${name}" ON ${definition}`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [name] of INDEXES) await queryRunner.query(`DROP INDEX "${name}"`);
  }
}
