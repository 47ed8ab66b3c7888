import type { MigrationInterface, QueryRunner } from 'typeorm';

export class ReferenceRecording1796175275320 implements MigrationInterface {
  name = 'ReferenceRecording1796175275320';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "standardisation_exercises" ADD "recording_key" text`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD "recording_content_type" text`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD "recording_bytes" integer`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD "recording_duration_seconds" double precision`);
    await q.query(`ALTER TABLE "standardisation_exercises" ADD CONSTRAINT "standardisation_exercises_recording" CHECK ((recording_key IS NULL) = (recording_content_type IS NULL))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "standardisation_exercises" DROP CONSTRAINT "standardisation_exercises_recording"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP COLUMN "recording_duration_seconds"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP COLUMN "recording_bytes"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP COLUMN "recording_content_type"`);
    await q.query(`ALTER TABLE "standardisation_exercises" DROP COLUMN "recording_key"`);
  }
}
