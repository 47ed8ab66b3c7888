import type { MigrationInterface, QueryRunner } from 'typeorm';

export class ProgressIndexes1796176027165 implements MigrationInterface {
  name = 'ProgressIndexes1796176027165';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX "IDX_5e54967d1c046349dffb2ddd9e" ON "results"  ("organisation_id", "list_version_id", "student_id", "computed_at") `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "public"."IDX_5e54967d1c046349dffb2ddd9e"`);
  }
}
