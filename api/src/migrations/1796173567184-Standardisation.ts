import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Standardisation1796173567184 implements MigrationInterface {
  name = 'Standardisation1796173567184';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "standardisation_exercises" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "title" text NOT NULL, "instructions" text NOT NULL DEFAULT '', "rubric_version_id" uuid NOT NULL, "requests" jsonb NOT NULL, "reference_marks" jsonb NOT NULL DEFAULT '[]', "status" text NOT NULL DEFAULT 'draft', "due_on" date, "created_by_membership_id" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "published_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "standardisation_exercises_published" CHECK ((status = 'published') = (published_at IS NOT NULL)), CONSTRAINT "standardisation_exercises_status" CHECK (status IN ('draft', 'published')), CONSTRAINT "PK_1a0ca071e586d390a6fb0b7526a" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_e0239fa5e0ab16e92a45a0851f" ON "standardisation_exercises"  ("rubric_version_id") `);
    await q.query(`CREATE INDEX "IDX_2a1cfc0bee6a6109b9d558c959" ON "standardisation_exercises"  ("created_by_membership_id") `);
    await q.query(`CREATE INDEX "IDX_dac477bf922de713e13fe9015d" ON "standardisation_exercises"  ("organisation_id", "status") `);
    await q.query(`CREATE TABLE "standardisation_attempts" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "exercise_id" uuid NOT NULL, "examiner_membership_id" uuid NOT NULL, "marks" jsonb NOT NULL DEFAULT '[]', "status" text NOT NULL DEFAULT 'draft', "started_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "submitted_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "standardisation_attempts_submitted" CHECK ((status = 'submitted') = (submitted_at IS NOT NULL)), CONSTRAINT "standardisation_attempts_status" CHECK (status IN ('draft', 'submitted')), CONSTRAINT "PK_96fccd4886f6973af40a8384bf7" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_e88e734b21852ee5641e177193" ON "standardisation_attempts"  ("examiner_membership_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_85722032e95dc68a76960f6fba" ON "standardisation_attempts"  ("exercise_id", "examiner_membership_id") `);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD CONSTRAINT "FK_d06c0d00d4c53dd7d0456fa097e" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD CONSTRAINT "FK_e0239fa5e0ab16e92a45a0851fb" FOREIGN KEY ("rubric_version_id") REFERENCES "rubric_versions"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD CONSTRAINT "FK_2a1cfc0bee6a6109b9d558c9590" FOREIGN KEY ("created_by_membership_id") REFERENCES "memberships"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "standardisation_attempts" ADD CONSTRAINT "FK_511bb8c5741810312cb5f16faff" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "standardisation_attempts" ADD CONSTRAINT "FK_76efcb95a2cb121f87756f8d54a" FOREIGN KEY ("exercise_id") REFERENCES "standardisation_exercises"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "standardisation_attempts" ADD CONSTRAINT "FK_e88e734b21852ee5641e1771932" FOREIGN KEY ("examiner_membership_id") REFERENCES "memberships"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "standardisation_attempts" DROP CONSTRAINT "FK_e88e734b21852ee5641e1771932"`);
    await q.query(`ALTER TABLE "standardisation_attempts" DROP CONSTRAINT "FK_76efcb95a2cb121f87756f8d54a"`);
    await q.query(`ALTER TABLE "standardisation_attempts" DROP CONSTRAINT "FK_511bb8c5741810312cb5f16faff"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP CONSTRAINT "FK_2a1cfc0bee6a6109b9d558c9590"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP CONSTRAINT "FK_e0239fa5e0ab16e92a45a0851fb"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP CONSTRAINT "FK_d06c0d00d4c53dd7d0456fa097e"`);
    await q.query(`DROP INDEX "public"."IDX_85722032e95dc68a76960f6fba"`);
    await q.query(`DROP INDEX "public"."IDX_e88e734b21852ee5641e177193"`);
    await q.query(`DROP TABLE "standardisation_attempts"`);
    await q.query(`DROP INDEX "public"."IDX_dac477bf922de713e13fe9015d"`);
    await q.query(`DROP INDEX "public"."IDX_2a1cfc0bee6a6109b9d558c959"`);
    await q.query(`DROP INDEX "public"."IDX_e0239fa5e0ab16e92a45a0851f"`);
    await q.query(`DROP TABLE "standardisation_exercises"`);
  }
}
