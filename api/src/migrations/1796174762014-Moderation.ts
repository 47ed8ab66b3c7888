import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Moderation1796174762014 implements MigrationInterface {
  name = 'Moderation1796174762014';

  async up(q: QueryRunner): Promise<void> {
    // Results reports and third-marking notices (the generator does not diff CHECK bodies).
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "outbound_mail_kind"`);
    await q.query(`ALTER TABLE "outbound_mail" ADD CONSTRAINT "outbound_mail_kind" CHECK (kind IN ('invitation', 'guardian_notice', 'password_reset', 'results_report', 'third_marking'))`);
    await q.query(`CREATE TABLE "moderation_cases" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "sitting_id" uuid NOT NULL, "slot_id" uuid NOT NULL, "status" text NOT NULL DEFAULT 'open', "comparison" jsonb NOT NULL, "agreed_marks" jsonb, "agreed_by_person_id" uuid, "agreed_at" TIMESTAMP WITH TIME ZONE, "agreed_reason" text, "third_examiner_membership_id" uuid, "sent_to_third_by_person_id" uuid, "sent_to_third_at" TIMESTAMP WITH TIME ZONE, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "resolved_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "moderation_cases_third" CHECK (status NOT IN ('third_marking', 'third') OR third_examiner_membership_id IS NOT NULL), CONSTRAINT "moderation_cases_agreed" CHECK ((status = 'agreed') = (agreed_marks IS NOT NULL AND agreed_by_person_id IS NOT NULL AND agreed_reason IS NOT NULL)), CONSTRAINT "moderation_cases_status" CHECK (status IN ('open', 'third_marking', 'agreed', 'third')), CONSTRAINT "PK_459740d91f1b96e6cc910ad29e1" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_68c782b75ec1e654ebadc408c5" ON "moderation_cases"  ("slot_id") `);
    await q.query(`CREATE INDEX "IDX_c7de698da12df302c37e505ab7" ON "moderation_cases"  ("third_examiner_membership_id") `);
    await q.query(`CREATE INDEX "IDX_ea9bb6ebaef00b9cff9cb25c91" ON "moderation_cases"  ("sitting_id", "status") `);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_cc0e8e36965931dcc6759274667" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_b007b9c1068e90046f31232e902" FOREIGN KEY ("sitting_id") REFERENCES "sittings"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_68c782b75ec1e654ebadc408c56" FOREIGN KEY ("slot_id") REFERENCES "slots"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_f8e059780b7d98c30684422e9bd" FOREIGN KEY ("agreed_by_person_id") REFERENCES "people"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_c7de698da12df302c37e505ab7d" FOREIGN KEY ("third_examiner_membership_id") REFERENCES "memberships"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "moderation_cases" ADD CONSTRAINT "FK_a200d4858ed90d50626d6184237" FOREIGN KEY ("sent_to_third_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DELETE FROM "outbound_mail" WHERE kind IN ('results_report', 'third_marking')`);
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "outbound_mail_kind"`);
    await q.query(`ALTER TABLE "outbound_mail" ADD CONSTRAINT "outbound_mail_kind" CHECK (kind IN ('invitation', 'guardian_notice', 'password_reset'))`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_a200d4858ed90d50626d6184237"`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_c7de698da12df302c37e505ab7d"`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_f8e059780b7d98c30684422e9bd"`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_68c782b75ec1e654ebadc408c56"`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_b007b9c1068e90046f31232e902"`);
    await q.query(`ALTER TABLE "moderation_cases" DROP CONSTRAINT "FK_cc0e8e36965931dcc6759274667"`);
    await q.query(`DROP INDEX "public"."IDX_ea9bb6ebaef00b9cff9cb25c91"`);
    await q.query(`DROP INDEX "public"."IDX_c7de698da12df302c37e505ab7"`);
    await q.query(`DROP INDEX "public"."IDX_68c782b75ec1e654ebadc408c5"`);
    await q.query(`DROP TABLE "moderation_cases"`);
  }
}
