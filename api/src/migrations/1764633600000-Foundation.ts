import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Organisations, people and memberships, sign-in tokens, terms, classes, students, guardians,
 * audit. Generated from the entities (see DEVELOPERS.md, "Adding a migration").
 */
export class Foundation1764633600000 implements MigrationInterface {
  name = 'Foundation1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "organisations" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" text NOT NULL, "slug" text NOT NULL, "time_zone" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_db67ac918db3917134d0c9edbb3" UNIQUE ("slug"), CONSTRAINT "PK_7bf54cba378d5b2f1d4c10ef4df" PRIMARY KEY ("id"))`);
    await q.query(`CREATE TABLE "memberships" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "person_id" uuid NOT NULL, "roles" text array NOT NULL, "active" boolean NOT NULL DEFAULT true, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "memberships_roles" CHECK (cardinality(roles) > 0 AND roles <@ ARRAY['admin', 'teacher', 'examiner', 'student']::text[]), CONSTRAINT "PK_25d28bd932097a9e90495ede7b4" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_efc5c4a293123bc6e5fa4306bc" ON "memberships"  ("person_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_88e582b3d72d4225e002c3474a" ON "memberships"  ("organisation_id", "person_id") `);
    await q.query(`CREATE TABLE "people" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "email" text NOT NULL, "password_hash" text, "token_version" integer NOT NULL DEFAULT '0', "display_name" text NOT NULL, "note_names" text NOT NULL DEFAULT 'british', "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "last_sign_in_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "UQ_c77e8752faa45901af2b245dff2" UNIQUE ("email"), CONSTRAINT "people_note_names" CHECK (note_names IN ('british', 'american')), CONSTRAINT "people_email_lower" CHECK (email = lower(email)), CONSTRAINT "PK_aa866e71353ee94c6cc51059c5b" PRIMARY KEY ("id"))`);
    await q.query(`CREATE TABLE "audit_events" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "actor_person_id" uuid, "action" text NOT NULL, "entity" text NOT NULL, "entity_id" uuid NOT NULL, "before" jsonb, "after" jsonb, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_910f64d901a5c3e9878f0d4a407" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_41a2b94b238a645b0e0603a23a" ON "audit_events"  ("organisation_id", "entity", "entity_id") `);
    await q.query(`CREATE TABLE "refresh_tokens" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "family_id" uuid NOT NULL, "person_id" uuid NOT NULL, "organisation_id" uuid NOT NULL, "token_hash" text NOT NULL, "token_version" integer NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL, "used_at" TIMESTAMP WITH TIME ZONE, "revoked_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "PK_7d8bee0204106019488c4c50ffa" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_d5e27da0cd39bc3bb2811fc8ba" ON "refresh_tokens"  ("family_id") `);
    await q.query(`CREATE INDEX "IDX_c33bcb8fa96ac4973f45d65e86" ON "refresh_tokens"  ("person_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_a7838d2ba25be1342091b6695f" ON "refresh_tokens"  ("token_hash") `);
    await q.query(`CREATE TABLE "terms" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "name" text NOT NULL, "academic_year" text NOT NULL, "starts_on" date NOT NULL, "ends_on" date NOT NULL, CONSTRAINT "terms_dates" CHECK (ends_on >= starts_on), CONSTRAINT "PK_33b6fe77d6ace7ff43cc8a65958" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_ebee207a2f9531851b85fda177" ON "terms"  ("organisation_id", "name") `);
    await q.query(`CREATE TABLE "guardians" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "student_id" uuid NOT NULL, "name" text NOT NULL, "email" text NOT NULL, "consent_results_email" boolean, "consent_recordings" boolean, "consent_answered_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "guardians_email_lower" CHECK (email = lower(email)), CONSTRAINT "PK_3dcf02f3dc96a2c017106f280be" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_4159eb1f612dd70dbc05153ec4" ON "guardians"  ("student_id", "email") `);
    await q.query(`CREATE INDEX "IDX_053956395467e7ceae9031ece7" ON "guardians"  ("organisation_id", "email") `);
    await q.query(`CREATE TABLE "students" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "membership_id" uuid, "pupil_number" text NOT NULL, "given_name" text NOT NULL, "family_name" text NOT NULL, "email" text, "date_of_birth" date NOT NULL, "grade" integer, "active" boolean NOT NULL DEFAULT true, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "students_email_lower" CHECK (email = lower(email)), CONSTRAINT "students_grade" CHECK (grade BETWEEN 0 AND 12), CONSTRAINT "PK_7d7f07271ad4ce999880713f05e" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_0cf5f3102ccbbc454d1497e815" ON "students"  ("membership_id") WHERE membership_id IS NOT NULL`);
    await q.query(`CREATE UNIQUE INDEX "IDX_44239f1fbeb49a21f3322849fc" ON "students"  ("organisation_id", "pupil_number") `);
    await q.query(`CREATE TABLE "classes" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "term_id" uuid, "name" text NOT NULL, "code" text NOT NULL, "grade" integer, "active" boolean NOT NULL DEFAULT true, CONSTRAINT "classes_grade" CHECK (grade BETWEEN 0 AND 12), CONSTRAINT "PK_e207aa15404e9b2ce35910f9f7f" PRIMARY KEY ("id"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_85e5704cd9062576b76e1b1b0d" ON "classes"  ("organisation_id", "code") `);
    await q.query(`CREATE TABLE "class_teachers" ("class_id" uuid NOT NULL, "membership_id" uuid NOT NULL, CONSTRAINT "PK_6614e251e60df55348d2c608104" PRIMARY KEY ("class_id", "membership_id"))`);
    await q.query(`CREATE INDEX "IDX_1192d6f4432d1de68d66e9a9cd" ON "class_teachers"  ("class_id") `);
    await q.query(`CREATE INDEX "IDX_611a03cc7e3ed57002b566c720" ON "class_teachers"  ("membership_id") `);
    await q.query(`CREATE TABLE "class_members" ("class_id" uuid NOT NULL, "student_id" uuid NOT NULL, CONSTRAINT "PK_a86e55ca8dcab99e2245cda6e17" PRIMARY KEY ("class_id", "student_id"))`);
    await q.query(`CREATE INDEX "IDX_2ace5ca20caf6953506af45c93" ON "class_members"  ("class_id") `);
    await q.query(`CREATE INDEX "IDX_0afbf47de031aa2347b3fd659f" ON "class_members"  ("student_id") `);
    await q.query(`ALTER TABLE "memberships" ADD CONSTRAINT "FK_55c59139e9136eb9a76ed30c6dc" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "memberships" ADD CONSTRAINT "FK_efc5c4a293123bc6e5fa4306bc4" FOREIGN KEY ("person_id") REFERENCES "people"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "audit_events" ADD CONSTRAINT "FK_91d46044e4c934c1b5f1ea229d1" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "audit_events" ADD CONSTRAINT "FK_7818fcd607ca9468a32d3f0144b" FOREIGN KEY ("actor_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "refresh_tokens" ADD CONSTRAINT "FK_c33bcb8fa96ac4973f45d65e867" FOREIGN KEY ("person_id") REFERENCES "people"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "refresh_tokens" ADD CONSTRAINT "FK_f1637a074f8d1b683067002b6cf" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "terms" ADD CONSTRAINT "FK_d1ef5447efc4354398bae5ad44e" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "guardians" ADD CONSTRAINT "FK_ca6633874a9664a90de811c7ed3" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "guardians" ADD CONSTRAINT "FK_69e793368dac6279adfd6ca55ad" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "students" ADD CONSTRAINT "FK_9bc89d9ec438d41951f76e25c94" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "students" ADD CONSTRAINT "FK_3023ee4482ae20e47afe18f7cee" FOREIGN KEY ("membership_id") REFERENCES "memberships"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "classes" ADD CONSTRAINT "FK_26dfbe535673bd41c6b8e4cd1b6" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "classes" ADD CONSTRAINT "FK_9d37ab9a9091a24ed1f6237b132" FOREIGN KEY ("term_id") REFERENCES "terms"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "class_teachers" ADD CONSTRAINT "FK_1192d6f4432d1de68d66e9a9cd7" FOREIGN KEY ("class_id") REFERENCES "classes"("id") ON DELETE CASCADE ON UPDATE CASCADE`);
    await q.query(`ALTER TABLE "class_teachers" ADD CONSTRAINT "FK_611a03cc7e3ed57002b566c720c" FOREIGN KEY ("membership_id") REFERENCES "memberships"("id") ON DELETE CASCADE ON UPDATE CASCADE`);
    await q.query(`ALTER TABLE "class_members" ADD CONSTRAINT "FK_2ace5ca20caf6953506af45c935" FOREIGN KEY ("class_id") REFERENCES "classes"("id") ON DELETE CASCADE ON UPDATE CASCADE`);
    await q.query(`ALTER TABLE "class_members" ADD CONSTRAINT "FK_0afbf47de031aa2347b3fd659f6" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE CASCADE ON UPDATE CASCADE`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "organisations"`);
    await q.query(`DROP TABLE "memberships"`);
    await q.query(`DROP INDEX "public"."IDX_efc5c4a293123bc6e5fa4306bc"`);
    await q.query(`DROP INDEX "public"."IDX_88e582b3d72d4225e002c3474a"`);
    await q.query(`DROP TABLE "people"`);
    await q.query(`DROP TABLE "audit_events"`);
    await q.query(`DROP INDEX "public"."IDX_41a2b94b238a645b0e0603a23a"`);
    await q.query(`DROP TABLE "refresh_tokens"`);
    await q.query(`DROP INDEX "public"."IDX_d5e27da0cd39bc3bb2811fc8ba"`);
    await q.query(`DROP INDEX "public"."IDX_c33bcb8fa96ac4973f45d65e86"`);
    await q.query(`DROP INDEX "public"."IDX_a7838d2ba25be1342091b6695f"`);
    await q.query(`DROP TABLE "terms"`);
    await q.query(`DROP INDEX "public"."IDX_ebee207a2f9531851b85fda177"`);
    await q.query(`DROP TABLE "guardians"`);
    await q.query(`DROP INDEX "public"."IDX_4159eb1f612dd70dbc05153ec4"`);
    await q.query(`DROP INDEX "public"."IDX_053956395467e7ceae9031ece7"`);
    await q.query(`DROP TABLE "students"`);
    await q.query(`DROP INDEX "public"."IDX_0cf5f3102ccbbc454d1497e815"`);
    await q.query(`DROP INDEX "public"."IDX_44239f1fbeb49a21f3322849fc"`);
    await q.query(`DROP TABLE "classes"`);
    await q.query(`DROP INDEX "public"."IDX_85e5704cd9062576b76e1b1b0d"`);
    await q.query(`DROP TABLE "class_teachers"`);
    await q.query(`DROP INDEX "public"."IDX_1192d6f4432d1de68d66e9a9cd"`);
    await q.query(`DROP INDEX "public"."IDX_611a03cc7e3ed57002b566c720"`);
    await q.query(`DROP TABLE "class_members"`);
    await q.query(`DROP INDEX "public"."IDX_2ace5ca20caf6953506af45c93"`);
    await q.query(`DROP INDEX "public"."IDX_0afbf47de031aa2347b3fd659f"`);
    await q.query(`ALTER TABLE "memberships" DROP CONSTRAINT "FK_55c59139e9136eb9a76ed30c6dc"`);
    await q.query(`ALTER TABLE "memberships" DROP CONSTRAINT "FK_efc5c4a293123bc6e5fa4306bc4"`);
    await q.query(`ALTER TABLE "audit_events" DROP CONSTRAINT "FK_91d46044e4c934c1b5f1ea229d1"`);
    await q.query(`ALTER TABLE "audit_events" DROP CONSTRAINT "FK_7818fcd607ca9468a32d3f0144b"`);
    await q.query(`ALTER TABLE "refresh_tokens" DROP CONSTRAINT "FK_c33bcb8fa96ac4973f45d65e867"`);
    await q.query(`ALTER TABLE "refresh_tokens" DROP CONSTRAINT "FK_f1637a074f8d1b683067002b6cf"`);
    await q.query(`ALTER TABLE "terms" DROP CONSTRAINT "FK_d1ef5447efc4354398bae5ad44e"`);
    await q.query(`ALTER TABLE "guardians" DROP CONSTRAINT "FK_ca6633874a9664a90de811c7ed3"`);
    await q.query(`ALTER TABLE "guardians" DROP CONSTRAINT "FK_69e793368dac6279adfd6ca55ad"`);
    await q.query(`ALTER TABLE "students" DROP CONSTRAINT "FK_9bc89d9ec438d41951f76e25c94"`);
    await q.query(`ALTER TABLE "students" DROP CONSTRAINT "FK_3023ee4482ae20e47afe18f7cee"`);
    await q.query(`ALTER TABLE "classes" DROP CONSTRAINT "FK_26dfbe535673bd41c6b8e4cd1b6"`);
    await q.query(`ALTER TABLE "classes" DROP CONSTRAINT "FK_9d37ab9a9091a24ed1f6237b132"`);
    await q.query(`ALTER TABLE "class_teachers" DROP CONSTRAINT "FK_1192d6f4432d1de68d66e9a9cd7"`);
    await q.query(`ALTER TABLE "class_teachers" DROP CONSTRAINT "FK_611a03cc7e3ed57002b566c720c"`);
    await q.query(`ALTER TABLE "class_members" DROP CONSTRAINT "FK_2ace5ca20caf6953506af45c935"`);
    await q.query(`ALTER TABLE "class_members" DROP CONSTRAINT "FK_0afbf47de031aa2347b3fd659f6"`);
  }
}
