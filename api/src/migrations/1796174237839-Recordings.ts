import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Recordings1796174237839 implements MigrationInterface {
  name = 'Recordings1796174237839';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "recordings" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "purpose" text NOT NULL, "slot_id" uuid, "student_id" uuid NOT NULL, "uploaded_by_person_id" uuid, "storage_key" text NOT NULL, "content_type" text NOT NULL, "size_bytes" integer NOT NULL, "duration_seconds" real, "original_name" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "recordings_duration" CHECK (duration_seconds IS NULL OR duration_seconds >= 0), CONSTRAINT "recordings_size" CHECK (size_bytes > 0), CONSTRAINT "recordings_practice_has_no_slot" CHECK (purpose = 'slot' OR slot_id IS NULL), CONSTRAINT "recordings_purpose" CHECK (purpose IN ('slot', 'practice')), CONSTRAINT "PK_8c3247d5ee4551d59bb2115a484" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_66f012e0192a272a4e8b449f2f" ON "recordings"  ("slot_id") `);
    await q.query(`CREATE UNIQUE INDEX "IDX_7b0940bda5fdc88bc5015cbfcc" ON "recordings"  ("storage_key") `);
    await q.query(`CREATE INDEX "IDX_d2a625842089f1573c5fd68b2a" ON "recordings"  ("organisation_id", "student_id") `);
    await q.query(`CREATE INDEX "IDX_8eb01afad67e1c416479e9fd75" ON "recordings"  ("expires_at") `);
    await q.query(`ALTER TABLE "organisations" ADD "recording_retention_days" integer NOT NULL DEFAULT '180'`);
    await q.query(`ALTER TABLE "sittings" ADD "recorded_exam" boolean NOT NULL DEFAULT false`);
    await q.query(`ALTER TABLE "recordings" ADD CONSTRAINT "FK_30187f9c16e8ec705ab7df15b6b" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "recordings" ADD CONSTRAINT "FK_66f012e0192a272a4e8b449f2f1" FOREIGN KEY ("slot_id") REFERENCES "slots"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "recordings" ADD CONSTRAINT "FK_3a97338feda24ee61662c67cb06" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE RESTRICT ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "recordings" ADD CONSTRAINT "FK_4065bd07f9af3301749d2c512c9" FOREIGN KEY ("uploaded_by_person_id") REFERENCES "people"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "recordings" DROP CONSTRAINT "FK_4065bd07f9af3301749d2c512c9"`);
    await q.query(`ALTER TABLE "recordings" DROP CONSTRAINT "FK_3a97338feda24ee61662c67cb06"`);
    await q.query(`ALTER TABLE "recordings" DROP CONSTRAINT "FK_66f012e0192a272a4e8b449f2f1"`);
    await q.query(`ALTER TABLE "recordings" DROP CONSTRAINT "FK_30187f9c16e8ec705ab7df15b6b"`);
    await q.query(`ALTER TABLE "sittings" DROP COLUMN "recorded_exam"`);
    await q.query(`ALTER TABLE "organisations" DROP COLUMN "recording_retention_days"`);
    await q.query(`DROP INDEX "public"."IDX_8eb01afad67e1c416479e9fd75"`);
    await q.query(`DROP INDEX "public"."IDX_d2a625842089f1573c5fd68b2a"`);
    await q.query(`DROP INDEX "public"."IDX_7b0940bda5fdc88bc5015cbfcc"`);
    await q.query(`DROP INDEX "public"."IDX_66f012e0192a272a4e8b449f2f"`);
    await q.query(`DROP TABLE "recordings"`);
  }
}
