import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * latest_results (issue 8 §7): each student's latest result per list lineage and grade, so the
 * progress percentile counts peers on one index range. Generated, then two steps added by hand:
 * the backfill from existing results (the same choice as ResultsService.refreshLatest: latest
 * computed_at, ties by id), and dropping IDX_results_peer_latest, which only that percentile
 * read (its DISTINCT ON over every peer's results is gone).
 */
export class LatestResults1796193339206 implements MigrationInterface {
  name = 'LatestResults1796193339206';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "latest_results" ("student_id" uuid NOT NULL, "list_id" uuid NOT NULL, "grade" text NOT NULL, "organisation_id" uuid NOT NULL, "result_id" uuid NOT NULL, "percentage" double precision NOT NULL, "computed_at" TIMESTAMP WITH TIME ZONE NOT NULL, CONSTRAINT "PK_28a9c140404a7fe3bf95a40ed0a" PRIMARY KEY ("student_id", "list_id", "grade"))`);
    await q.query(`CREATE UNIQUE INDEX "IDX_cc01bc36ce1303126405f65377" ON "latest_results"  ("result_id") `);
    await q.query(`CREATE INDEX "IDX_c53b8fe3f99b9fb6e606f588b8" ON "latest_results"  ("organisation_id", "list_id", "grade", "percentage", "computed_at") `);
    await q.query(`ALTER TABLE "latest_results" ADD CONSTRAINT "FK_aa6073e6f7a7c9542c5d86f493c" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "latest_results" ADD CONSTRAINT "FK_383cdad3ebc9abc48fcfa9a8988" FOREIGN KEY ("student_id") REFERENCES "students"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "latest_results" ADD CONSTRAINT "FK_cc01bc36ce1303126405f653778" FOREIGN KEY ("result_id") REFERENCES "results"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`INSERT INTO "latest_results" ("student_id", "list_id", "grade", "organisation_id", "result_id", "percentage", "computed_at")
      SELECT DISTINCT ON (r.student_id, v.list_id, v.grade) r.student_id, v.list_id, v.grade, r.organisation_id, r.id, r.percentage, r.computed_at
        FROM "results" r JOIN "requirement_list_versions" v ON v.id = r.list_version_id
       ORDER BY r.student_id, v.list_id, v.grade, r.computed_at DESC, r.id DESC`);
    await q.query(`DROP INDEX "public"."IDX_results_peer_latest"`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE INDEX "IDX_results_peer_latest" ON "results" ("organisation_id", "list_version_id", "student_id", "computed_at" DESC) INCLUDE ("percentage")`,
    );
    await q.query(`ALTER TABLE "latest_results" DROP CONSTRAINT "FK_cc01bc36ce1303126405f653778"`);
    await q.query(`ALTER TABLE "latest_results" DROP CONSTRAINT "FK_383cdad3ebc9abc48fcfa9a8988"`);
    await q.query(`ALTER TABLE "latest_results" DROP CONSTRAINT "FK_aa6073e6f7a7c9542c5d86f493c"`);
    await q.query(`DROP INDEX "public"."IDX_c53b8fe3f99b9fb6e606f588b8"`);
    await q.query(`DROP INDEX "public"."IDX_cc01bc36ce1303126405f65377"`);
    await q.query(`DROP TABLE "latest_results"`);
  }
}
