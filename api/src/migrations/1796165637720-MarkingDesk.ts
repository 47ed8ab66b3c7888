import type { MigrationInterface, QueryRunner } from 'typeorm';

export class MarkingDesk1796165637720 implements MigrationInterface {
  name = 'MarkingDesk1796165637720';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "slot_draws" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "slot_id" uuid NOT NULL, "student_id" uuid NOT NULL, "seed" text NOT NULL, "algorithm" text NOT NULL, "drawn" jsonb NOT NULL, "requests" jsonb NOT NULL, "changes" jsonb NOT NULL DEFAULT '[]', "repeats_of_previous" integer NOT NULL DEFAULT '0', "drawn_by_person_id" uuid, "drawn_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_24daf39088d9c1643ef414d6c01" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_9bdf60f74d6b984ff049b7700b" ON "slot_draws"  ("student_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_e7d04b9addc23c27759b735b35" ON "slot_draws"  ("slot_id") `);
    await q.query(`CREATE TABLE "mark_sheets" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "slot_id" uuid NOT NULL, "examiner_membership_id" uuid NOT NULL, "role" text NOT NULL, "status" text NOT NULL DEFAULT 'draft', "started_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "submitted_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "mark_sheets_submitted" CHECK ((status = 'submitted') = (submitted_at IS NOT NULL)), CONSTRAINT "mark_sheets_role" CHECK (role IN ('first', 'second')), CONSTRAINT "mark_sheets_status" CHECK (status IN ('draft', 'submitted')), CONSTRAINT "PK_b38ee8a5e607a283b42436ade00" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_c4977a86a4ce73be075a65d82e" ON "mark_sheets"  ("examiner_membership_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_9a2ac0e7fa725ae3285c63df1e" ON "mark_sheets"  ("slot_id", "examiner_membership_id") `);
    await q.query(`CREATE TABLE "mark_cells" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "sheet_id" uuid NOT NULL, "cell" text NOT NULL, "value" jsonb, "version" integer NOT NULL, "last_change_id" uuid NOT NULL, "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_954cfc096225ba210f09f1e986f" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_4440f9c1120c637d078c9cd8c6" ON "mark_cells"  ("sheet_id", "cell") `);
    await q.query(`CREATE TABLE "mark_changes" ("change_id" uuid NOT NULL, "sheet_id" uuid NOT NULL, "cell" text NOT NULL, "value" jsonb, "base_version" integer NOT NULL, "result" text NOT NULL, "version" integer NOT NULL, "theirs" jsonb, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_ab15507451a28a000a608c227d3" PRIMARY KEY ("change_id"))`);
    await q.query(`CREATE INDEX "IDX_8beb85085c9796e7fb16df0b17" ON "mark_changes"  ("sheet_id", "created_at") `);
    await q.query(`ALTER TABLE "slot_draws" ADD CONSTRAINT "FK_9ad7670cf8d022e057fe3515e9c" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "slot_draws" ADD CONSTRAINT "FK_e7d04b9addc23c27759b735b350" FOREIGN KEY ("slot_id") REFERENCES "slots"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "slot_draws" ADD CONSTRAINT "FK_b4063ed06187a5f2493d86b0419" FOREIGN KEY ("drawn_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_sheets" ADD CONSTRAINT "FK_23cc3d33d93729a91f74fdd27c3" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_sheets" ADD CONSTRAINT "FK_0d0c7b9668905b51ceefcb0d952" FOREIGN KEY ("slot_id") REFERENCES "slots"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_sheets" ADD CONSTRAINT "FK_c4977a86a4ce73be075a65d82e8" FOREIGN KEY ("examiner_membership_id") REFERENCES "memberships"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_cells" ADD CONSTRAINT "FK_ff56f3cb3c1038a4db379bb8b26" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_cells" ADD CONSTRAINT "FK_3fad189835948d1e9e66548f02f" FOREIGN KEY ("sheet_id") REFERENCES "mark_sheets"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "mark_changes" ADD CONSTRAINT "FK_0f446c8be9771946fd33553e2be" FOREIGN KEY ("sheet_id") REFERENCES "mark_sheets"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "mark_changes" DROP CONSTRAINT "FK_0f446c8be9771946fd33553e2be"`);
    await q.query(`ALTER TABLE "mark_cells" DROP CONSTRAINT "FK_3fad189835948d1e9e66548f02f"`);
    await q.query(`ALTER TABLE "mark_cells" DROP CONSTRAINT "FK_ff56f3cb3c1038a4db379bb8b26"`);
    await q.query(`ALTER TABLE "mark_sheets" DROP CONSTRAINT "FK_c4977a86a4ce73be075a65d82e8"`);
    await q.query(`ALTER TABLE "mark_sheets" DROP CONSTRAINT "FK_0d0c7b9668905b51ceefcb0d952"`);
    await q.query(`ALTER TABLE "mark_sheets" DROP CONSTRAINT "FK_23cc3d33d93729a91f74fdd27c3"`);
    await q.query(`ALTER TABLE "slot_draws" DROP CONSTRAINT "FK_b4063ed06187a5f2493d86b0419"`);
    await q.query(`ALTER TABLE "slot_draws" DROP CONSTRAINT "FK_e7d04b9addc23c27759b735b350"`);
    await q.query(`ALTER TABLE "slot_draws" DROP CONSTRAINT "FK_9ad7670cf8d022e057fe3515e9c"`);
    await q.query(`DROP INDEX "public"."IDX_8beb85085c9796e7fb16df0b17"`);
    await q.query(`DROP TABLE "mark_changes"`);
    await q.query(`DROP INDEX "public"."IDX_4440f9c1120c637d078c9cd8c6"`);
    await q.query(`DROP TABLE "mark_cells"`);
    await q.query(`DROP INDEX "public"."IDX_9a2ac0e7fa725ae3285c63df1e"`);
    await q.query(`DROP INDEX "public"."IDX_c4977a86a4ce73be075a65d82e"`);
    await q.query(`DROP TABLE "mark_sheets"`);
    await q.query(`DROP INDEX "public"."IDX_e7d04b9addc23c27759b735b35"`);
    await q.query(`DROP INDEX "public"."IDX_9bdf60f74d6b984ff049b7700b"`);
    await q.query(`DROP TABLE "slot_draws"`);
  }
}
