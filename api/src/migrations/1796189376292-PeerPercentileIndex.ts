import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The progress percentile reads each same-grade student's latest result in a list version. With
 * computed_at descending and the percentage included, that is an index-only scan in the order
 * DISTINCT ON needs, with no sort and no table reads (issue 8 §7: 20,000 students). TypeORM cannot
 * describe DESC or INCLUDE, so the entity declares it by name with synchronize: false and this
 * migration is written by hand; it replaces the plain four-column index of ProgressIndexes.
 */
export class PeerPercentileIndex1796189376292 implements MigrationInterface {
  name = 'PeerPercentileIndex1796189376292';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "public"."IDX_5e54967d1c046349dffb2ddd9e"`);
    await q.query(
      `CREATE INDEX "IDX_results_peer_latest" ON "results" ("organisation_id", "list_version_id", "student_id", "computed_at" DESC) INCLUDE ("percentage")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "public"."IDX_results_peer_latest"`);
    await q.query(`CREATE INDEX "IDX_5e54967d1c046349dffb2ddd9e" ON "results"  ("organisation_id", "list_version_id", "student_id", "computed_at") `);
  }
}
