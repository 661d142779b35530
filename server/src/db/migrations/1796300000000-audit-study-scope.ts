import type { MigrationInterface, QueryRunner } from 'typeorm';
import {
  AUDIT_APPEND_ONLY,
  STUDY_TARGET_TYPES,
  studyOfTargetSql,
} from '../../audit/audit-study.js';

const TRIGGERS: ReadonlyArray<[name: string, definition: string]> = [
  [
    'TR_audit_event_no_update',
    `BEFORE UPDATE ON "audit_event" BEGIN SELECT RAISE(ABORT, '${AUDIT_APPEND_ONLY}'); END`,
  ],
  [
    'TR_audit_event_no_delete',
    `BEFORE DELETE ON "audit_event" BEGIN SELECT RAISE(ABORT, '${AUDIT_APPEND_ONLY}'); END`,
  ],
];

/**
 * Audit events learn the study they belong to (`study_id`, backfilled from their targets, NULL
 * for users and invitations), so a reader sees only the events of studies they can see; and the
 * audit log becomes append-only inside SQLite: triggers refuse every UPDATE and DELETE.
 */
export class AuditStudyScope1796300000000 implements MigrationInterface {
  name = 'AuditStudyScope1796300000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "audit_event" ADD COLUMN "study_id" varchar(36)`);
    for (const type of STUDY_TARGET_TYPES) {
      const sql = studyOfTargetSql(type, '"audit_event"."target_id"');
      await queryRunner.query(
        `UPDATE "audit_event" SET "study_id" = ${sql} WHERE "target_type" = ?`,
        [type],
      );
    }
    await queryRunner.query(
      `CREATE INDEX "IDX_audit_event_study" ON "audit_event" ("study_id", "created_at")`,
    );
    for (const [name, definition] of TRIGGERS) {
      await queryRunner.query(`CREATE TRIGGER "${name}" ${definition}`);
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [name] of TRIGGERS) await queryRunner.query(`DROP TRIGGER "${name}"`);
    await queryRunner.query(`DROP INDEX "IDX_audit_event_study"`);
    await queryRunner.query(`ALTER TABLE "audit_event" DROP COLUMN "study_id"`);
  }
}
