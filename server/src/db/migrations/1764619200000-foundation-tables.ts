import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The foundation's tables: users, invitations, studies with members, audit events, settings.
 * Being the baseline, its `down` necessarily drops every row; later migrations must keep them.
 * Constraint names match what TypeORM derives from the entities, so the schema builder sees no
 * difference (tested in migrations.spec.ts).
 */
export class FoundationTables1764619200000 implements MigrationInterface {
  name = 'FoundationTables1764619200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "user" ("id" varchar PRIMARY KEY NOT NULL, "email" varchar(254) NOT NULL, "display_name" varchar(100) NOT NULL, "role" varchar(16) NOT NULL, "password_hash" varchar(300) NOT NULL, "token_version" integer NOT NULL DEFAULT (0), "disabled" boolean NOT NULL DEFAULT (0), "created_at" varchar(30) NOT NULL, CONSTRAINT "UQ_e12875dfb3b1d92d7d7c5377e22" UNIQUE ("email"))`,
    );
    await queryRunner.query(
      `CREATE TABLE "setting" ("key" varchar(64) PRIMARY KEY NOT NULL, "value" text NOT NULL)`,
    );
    await queryRunner.query(
      `CREATE TABLE "invitation" ("id" varchar PRIMARY KEY NOT NULL, "email" varchar(254) NOT NULL, "role" varchar(16) NOT NULL, "created_at" varchar(30) NOT NULL, "accepted_at" varchar(30), "invited_by_id" varchar NOT NULL, CONSTRAINT "FK_9fcebfddfa4369ac0e3c26dc8a3" FOREIGN KEY ("invited_by_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE TABLE "study" ("id" varchar PRIMARY KEY NOT NULL, "title" varchar(200) NOT NULL, "description" text NOT NULL DEFAULT (''), "created_at" varchar(30) NOT NULL, "updated_at" varchar(30) NOT NULL, "owner_id" varchar NOT NULL, CONSTRAINT "FK_869355143d13e23945b9fbf801c" FOREIGN KEY ("owner_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE TABLE "study_member" ("id" varchar PRIMARY KEY NOT NULL, "added_at" varchar(30) NOT NULL, "study_id" varchar NOT NULL, "user_id" varchar NOT NULL, CONSTRAINT "UQ_study_member_pair" UNIQUE ("study_id", "user_id"), CONSTRAINT "FK_f3930396d88ce0ec87954f2b217" FOREIGN KEY ("study_id") REFERENCES "study" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_22202d0756b6853a852794cba1d" FOREIGN KEY ("user_id") REFERENCES "user" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE TABLE "audit_event" ("id" varchar PRIMARY KEY NOT NULL, "action" varchar(64) NOT NULL, "target_type" varchar(32) NOT NULL, "target_id" varchar(36) NOT NULL, "detail" text NOT NULL DEFAULT ('{}'), "created_at" varchar(30) NOT NULL, "actor_id" varchar NOT NULL, CONSTRAINT "FK_f44b7e9c0d50176bc07e018f637" FOREIGN KEY ("actor_id") REFERENCES "user" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['audit_event', 'study_member', 'study', 'invitation', 'setting', 'user']) {
      await queryRunner.query(`DROP TABLE "${table}"`);
    }
  }
}
