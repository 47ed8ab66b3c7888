import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Results1796173495994 implements MigrationInterface {
  name = 'Results1796173495994';

  async up(q: QueryRunner): Promise<void> {
    // A third marker's sheet (moderation, design.md §4.5); the generator does not diff CHECK bodies.
    await q.query(`ALTER TABLE "mark_sheets" DROP CONSTRAINT "mark_sheets_role"`);
    await q.query(`ALTER TABLE "mark_sheets" ADD CONSTRAINT "mark_sheets_role" CHECK (role IN ('first', 'second', 'third'))`);
    await q.query(`CREATE TABLE "results" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "sitting_id" uuid NOT NULL, "slot_id" uuid NOT NULL, "student_id" uuid NOT NULL, "list_version_id" uuid NOT NULL, "band_policy_version_id" uuid NOT NULL, "rule_version" text NOT NULL, "basis" text NOT NULL, "total" integer NOT NULL, "out_of" integer NOT NULL, "percentage" double precision NOT NULL, "band_key" text NOT NULL, "band_label" text NOT NULL, "profile" jsonb NOT NULL, "slips" integer NOT NULL DEFAULT '0', "notes_played" integer, "computed_at" TIMESTAMP WITH TIME ZONE NOT NULL, "released_at" TIMESTAMP WITH TIME ZONE, "released_by_person_id" uuid, "teacher_note" text, CONSTRAINT "results_total" CHECK (total >= 0 AND out_of > 0 AND total <= out_of), CONSTRAINT "results_basis" CHECK (basis IN ('single', 'first', 'agreed', 'third')), CONSTRAINT "PK_e8f2a9191c61c15b627c117a678" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_97cb3b290abcb438f915009480" ON "results"  ("slot_id") `);
    await q.query(`CREATE INDEX "IDX_e79b5dd112d9b0183d052f4d20" ON "results"  ("sitting_id") `);
    await q.query(`CREATE INDEX "IDX_5acecf7ce94d937b83167b3f44" ON "results"  ("organisation_id", "student_id", "computed_at") `);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_1394dd648f916830b5d505015b4" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_e79b5dd112d9b0183d052f4d20d" FOREIGN KEY ("sitting_id") REFERENCES "sittings"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_97cb3b290abcb438f9150094805" FOREIGN KEY ("slot_id") REFERENCES "slots"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_7c5bf104ec5fbc6d177be01af8e" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_5e487ef64842446920102b58faf" FOREIGN KEY ("list_version_id") REFERENCES "requirement_list_versions"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_313d85659edea453a0a74e18d34" FOREIGN KEY ("band_policy_version_id") REFERENCES "band_policies"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "results" ADD CONSTRAINT "FK_a7b80820bc788cf18441801e13c" FOREIGN KEY ("released_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_a7b80820bc788cf18441801e13c"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_313d85659edea453a0a74e18d34"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_5e487ef64842446920102b58faf"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_7c5bf104ec5fbc6d177be01af8e"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_97cb3b290abcb438f9150094805"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_e79b5dd112d9b0183d052f4d20d"`);
    await q.query(`ALTER TABLE "results" DROP CONSTRAINT "FK_1394dd648f916830b5d505015b4"`);
    await q.query(`DROP INDEX "public"."IDX_5acecf7ce94d937b83167b3f44"`);
    await q.query(`DROP INDEX "public"."IDX_e79b5dd112d9b0183d052f4d20"`);
    await q.query(`DROP INDEX "public"."IDX_97cb3b290abcb438f915009480"`);
    await q.query(`DROP TABLE "results"`);
    await q.query(`ALTER TABLE "mark_sheets" DROP CONSTRAINT "mark_sheets_role"`);
    await q.query(`ALTER TABLE "mark_sheets" ADD CONSTRAINT "mark_sheets_role" CHECK (role IN ('first', 'second'))`);
  }
}
