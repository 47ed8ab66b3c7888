import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Rubrics with versions and criteria, requirement lists with versions and lines, students'
 * approved fingerings (issue 3). Generated from the entities.
 */
export class RubricsListsFingerings1796163564233 implements MigrationInterface {
  name = 'RubricsListsFingerings1796163564233';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "rubrics" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "starter_key" text, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_3dfcdc7f63f3fa048ebe0293a90" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_39028757406f5f22b0f22923dd" ON "rubrics"  ("organisation_id", "starter_key") WHERE starter_key IS NOT NULL`);
    await q.query(`CREATE TABLE "rubric_versions" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "rubric_id" uuid NOT NULL, "version" integer NOT NULL, "status" text NOT NULL DEFAULT 'draft', "name" text NOT NULL, "kinds" text array NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "created_by_person_id" uuid, "published_at" TIMESTAMP WITH TIME ZONE, "published_by_person_id" uuid, CONSTRAINT "rubric_versions_kinds" CHECK (cardinality(kinds) > 0), CONSTRAINT "rubric_versions_published" CHECK ((status = 'published') = (published_at IS NOT NULL)), CONSTRAINT "rubric_versions_status" CHECK (status IN ('draft', 'published')), CONSTRAINT "PK_a07f5d509c7c006b1572abdc5ae" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "rubric_versions_one_draft" ON "rubric_versions"  ("rubric_id") WHERE status = 'draft'`);
    await q.query(`CREATE UNIQUE INDEX "IDX_85a3980ecfc20b56cafc05ae26" ON "rubric_versions"  ("rubric_id", "version") `);
    await q.query(`CREATE TABLE "rubric_criteria" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "rubric_version_id" uuid NOT NULL, "position" integer NOT NULL, "key" text NOT NULL, "label" text NOT NULL, "description" text, "weight" double precision NOT NULL, "max_mark" integer NOT NULL, "descriptors" jsonb NOT NULL, CONSTRAINT "rubric_criteria_max_mark" CHECK (max_mark BETWEEN 1 AND 10), CONSTRAINT "rubric_criteria_weight" CHECK (weight > 0), CONSTRAINT "PK_8bdb168f88489aa75202269f994" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_b1a4a89c545cdffcc08b8510dc" ON "rubric_criteria"  ("rubric_version_id", "position") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_eefc648bc557083e96860abc0d" ON "rubric_criteria"  ("rubric_version_id", "key") `);
    await q.query(`CREATE TABLE "requirement_lists" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "starter_key" text, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_46979acd0b989b7e0f1a8dd3a99" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_f42186ca7167c908afbfee3970" ON "requirement_lists"  ("organisation_id", "starter_key") WHERE starter_key IS NOT NULL`);
    await q.query(`CREATE TABLE "requirement_list_versions" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "list_id" uuid NOT NULL, "version" integer NOT NULL, "status" text NOT NULL DEFAULT 'draft', "name" text NOT NULL, "grade" text NOT NULL, "total_marks" integer NOT NULL, "selection_rule" jsonb NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "created_by_person_id" uuid, "published_at" TIMESTAMP WITH TIME ZONE, "published_by_person_id" uuid, "used_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "requirement_list_versions_total" CHECK (total_marks > 0), CONSTRAINT "requirement_list_versions_used" CHECK (used_at IS NULL OR status = 'published'), CONSTRAINT "requirement_list_versions_published" CHECK ((status = 'published') = (published_at IS NOT NULL)), CONSTRAINT "requirement_list_versions_status" CHECK (status IN ('draft', 'published')), CONSTRAINT "PK_661effac1bbb41daaa37b895b3e" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_08989ba4d305f91171b92b3068" ON "requirement_list_versions"  ("organisation_id", "grade") `);
    await q.query(`CREATE UNIQUE INDEX "requirement_list_versions_one_draft" ON "requirement_list_versions"  ("list_id") WHERE status = 'draft'`);
    await q.query(`CREATE UNIQUE INDEX "IDX_3d44dd16a1b7a3288b62ab35ec" ON "requirement_list_versions"  ("list_id", "version") `);
    await q.query(`CREATE TABLE "requirement_lines" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "list_version_id" uuid NOT NULL, "position" integer NOT NULL, "kind" text NOT NULL, "label" text, "keys" text array NOT NULL, "modes" text array NOT NULL, "hands" text array NOT NULL, "motions" text array NOT NULL, "octaves" integer array NOT NULL, "directions" text array, "articulations" text array NOT NULL, "dynamics" text array NOT NULL, "inversions" text array NOT NULL, "tempo_bpm" double precision NOT NULL, "tempo_beat_unit" text NOT NULL, "tempo_notes_per_beat" integer NOT NULL, "rubric_version_id" uuid NOT NULL, "difficulty_weight" double precision NOT NULL, "titles" text array, "duration_seconds" double precision, CONSTRAINT "requirement_lines_weight" CHECK (difficulty_weight > 0), CONSTRAINT "requirement_lines_tempo" CHECK (tempo_bpm > 0 AND tempo_notes_per_beat >= 1), CONSTRAINT "requirement_lines_kind" CHECK (kind IN ('scale', 'arpeggio', 'broken_chord', 'chromatic', 'dominant_seventh', 'diminished_seventh', 'passage', 'other')), CONSTRAINT "PK_4215fa22f0e92fae92c87319b4f" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_ee968b174337050edfa203d1f6" ON "requirement_lines"  ("rubric_version_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_632c2402d60b6eef2d9e7e5130" ON "requirement_lines"  ("list_version_id", "position") `);
    await q.query(`CREATE TABLE "student_fingerings" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "student_id" uuid NOT NULL, "request" text NOT NULL, "kind" text NOT NULL, "key" text NOT NULL, "mode" text, "hand" text NOT NULL, "inversion" text, "octaves" integer NOT NULL, "direction" text NOT NULL, "digits" smallint array NOT NULL, "note" text, "revision" integer NOT NULL, "set_by_person_id" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "student_fingerings_revision" CHECK (revision >= 1), CONSTRAINT "student_fingerings_digits" CHECK (cardinality(digits) > 0 AND digits <@ ARRAY[1, 2, 3, 4, 5]::smallint[]), CONSTRAINT "student_fingerings_hand" CHECK (hand IN ('RH', 'LH')), CONSTRAINT "PK_87d25387e5eeb4bb8ec04ee1c57" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_97fe8c9035155033a5bc13f4e3" ON "student_fingerings"  ("student_id", "request", "revision") `);
    await q.query(`ALTER TABLE "rubrics" ADD CONSTRAINT "FK_f4d57e4fb6ee26d7b81d5e386a2" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "rubric_versions" ADD CONSTRAINT "FK_d0e3b1a022ef8adc10974e295b5" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "rubric_versions" ADD CONSTRAINT "FK_914230f59cc822cb13c655aa810" FOREIGN KEY ("rubric_id") REFERENCES "rubrics"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "rubric_versions" ADD CONSTRAINT "FK_c144edcbc227afb80c4148ee270" FOREIGN KEY ("created_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "rubric_versions" ADD CONSTRAINT "FK_7130f891757b91c0599760dfa46" FOREIGN KEY ("published_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "rubric_criteria" ADD CONSTRAINT "FK_b5fd85d580981587cff418f6fcb" FOREIGN KEY ("rubric_version_id") REFERENCES "rubric_versions"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_lists" ADD CONSTRAINT "FK_3babb45f693112312062817ebb4" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_list_versions" ADD CONSTRAINT "FK_fcc922f89dbac756a7f49c86b69" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_list_versions" ADD CONSTRAINT "FK_810bd484f4523c89acfe5567796" FOREIGN KEY ("list_id") REFERENCES "requirement_lists"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_list_versions" ADD CONSTRAINT "FK_d5dca32ab593a4ad29f1b7c4285" FOREIGN KEY ("created_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_list_versions" ADD CONSTRAINT "FK_aeabed85c682ed26974730a2617" FOREIGN KEY ("published_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_lines" ADD CONSTRAINT "FK_fd3f4a479fa8220d1b3069fa60e" FOREIGN KEY ("list_version_id") REFERENCES "requirement_list_versions"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "requirement_lines" ADD CONSTRAINT "FK_ee968b174337050edfa203d1f6d" FOREIGN KEY ("rubric_version_id") REFERENCES "rubric_versions"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "student_fingerings" ADD CONSTRAINT "FK_8da4b1ad5b27999ebdc4566a33b" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "student_fingerings" ADD CONSTRAINT "FK_1334adfc4eff7c0cc38b0ba7330" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "student_fingerings" ADD CONSTRAINT "FK_b842b321740ea1f36912f6afc44" FOREIGN KEY ("set_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "student_fingerings" DROP CONSTRAINT "FK_b842b321740ea1f36912f6afc44"`);
    await q.query(`ALTER TABLE "student_fingerings" DROP CONSTRAINT "FK_1334adfc4eff7c0cc38b0ba7330"`);
    await q.query(`ALTER TABLE "student_fingerings" DROP CONSTRAINT "FK_8da4b1ad5b27999ebdc4566a33b"`);
    await q.query(`ALTER TABLE "requirement_lines" DROP CONSTRAINT "FK_ee968b174337050edfa203d1f6d"`);
    await q.query(`ALTER TABLE "requirement_lines" DROP CONSTRAINT "FK_fd3f4a479fa8220d1b3069fa60e"`);
    await q.query(`ALTER TABLE "requirement_list_versions" DROP CONSTRAINT "FK_aeabed85c682ed26974730a2617"`);
    await q.query(`ALTER TABLE "requirement_list_versions" DROP CONSTRAINT "FK_d5dca32ab593a4ad29f1b7c4285"`);
    await q.query(`ALTER TABLE "requirement_list_versions" DROP CONSTRAINT "FK_810bd484f4523c89acfe5567796"`);
    await q.query(`ALTER TABLE "requirement_list_versions" DROP CONSTRAINT "FK_fcc922f89dbac756a7f49c86b69"`);
    await q.query(`ALTER TABLE "requirement_lists" DROP CONSTRAINT "FK_3babb45f693112312062817ebb4"`);
    await q.query(`ALTER TABLE "rubric_criteria" DROP CONSTRAINT "FK_b5fd85d580981587cff418f6fcb"`);
    await q.query(`ALTER TABLE "rubric_versions" DROP CONSTRAINT "FK_7130f891757b91c0599760dfa46"`);
    await q.query(`ALTER TABLE "rubric_versions" DROP CONSTRAINT "FK_c144edcbc227afb80c4148ee270"`);
    await q.query(`ALTER TABLE "rubric_versions" DROP CONSTRAINT "FK_914230f59cc822cb13c655aa810"`);
    await q.query(`ALTER TABLE "rubric_versions" DROP CONSTRAINT "FK_d0e3b1a022ef8adc10974e295b5"`);
    await q.query(`ALTER TABLE "rubrics" DROP CONSTRAINT "FK_f4d57e4fb6ee26d7b81d5e386a2"`);
    await q.query(`DROP INDEX "public"."IDX_97fe8c9035155033a5bc13f4e3"`);
    await q.query(`DROP TABLE "student_fingerings"`);
    await q.query(`DROP INDEX "public"."IDX_632c2402d60b6eef2d9e7e5130"`);
    await q.query(`DROP INDEX "public"."IDX_ee968b174337050edfa203d1f6"`);
    await q.query(`DROP TABLE "requirement_lines"`);
    await q.query(`DROP INDEX "public"."IDX_3d44dd16a1b7a3288b62ab35ec"`);
    await q.query(`DROP INDEX "public"."requirement_list_versions_one_draft"`);
    await q.query(`DROP INDEX "public"."IDX_08989ba4d305f91171b92b3068"`);
    await q.query(`DROP TABLE "requirement_list_versions"`);
    await q.query(`DROP INDEX "public"."IDX_f42186ca7167c908afbfee3970"`);
    await q.query(`DROP TABLE "requirement_lists"`);
    await q.query(`DROP INDEX "public"."IDX_eefc648bc557083e96860abc0d"`);
    await q.query(`DROP INDEX "public"."IDX_b1a4a89c545cdffcc08b8510dc"`);
    await q.query(`DROP TABLE "rubric_criteria"`);
    await q.query(`DROP INDEX "public"."IDX_85a3980ecfc20b56cafc05ae26"`);
    await q.query(`DROP INDEX "public"."rubric_versions_one_draft"`);
    await q.query(`DROP TABLE "rubric_versions"`);
    await q.query(`DROP INDEX "public"."IDX_39028757406f5f22b0f22923dd"`);
    await q.query(`DROP TABLE "rubrics"`);
  }
}
