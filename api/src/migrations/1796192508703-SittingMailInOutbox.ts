import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Sitting invitations, changes and cancellations become OutboundMail rows like every other
 * e-mail (kinds sitting_*, their words and calendar file in `data`, the sitting in `sitting_id`);
 * the separate sitting_mail table goes. Rows already there are carried over. One not yet sent had
 * its job in the old queue, which nothing reads now, so it is carried over as failed, saying so.
 */
export class SittingMailInOutbox1796192508703 implements MigrationInterface {
  name = 'SittingMailInOutbox1796192508703';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "outbound_mail" ADD "sitting_id" uuid`);
    await q.query(`CREATE INDEX "IDX_c947a520e9aec363f77eac2ce8" ON "outbound_mail"  ("sitting_id") `);
    await q.query(`ALTER TABLE "outbound_mail" ADD CONSTRAINT "FK_c947a520e9aec363f77eac2ce8c" FOREIGN KEY ("sitting_id") REFERENCES "sittings"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "outbound_mail_kind"`);
    await q.query(
      `ALTER TABLE "outbound_mail" ADD CONSTRAINT "outbound_mail_kind" CHECK (kind IN ('invitation', 'guardian_notice', 'password_reset', 'results_report', 'third_marking', 'sitting_invitation', 'sitting_change', 'sitting_cancellation'))`,
    );
    await q.query(
      `INSERT INTO outbound_mail (id, organisation_id, sitting_id, kind, to_address, to_name, data, status, attempts, last_error, subject, message_id, created_at, sent_at)
       SELECT id, organisation_id, sitting_id, 'sitting_' || kind, to_address, to_name,
              jsonb_build_object('subject', subject, 'text', body_text, 'ics', ics, 'icsFilename', ics_filename),
              CASE WHEN status IN ('sent', 'failed') THEN status ELSE 'failed' END, attempts,
              CASE WHEN status IN ('sent', 'failed') THEN last_error ELSE 'Not sent before sitting mail moved to the outbox.' END,
              subject, message_id, created_at, sent_at
         FROM sitting_mail`,
    );
    await q.query(`DROP TABLE "sitting_mail"`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "sitting_mail" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid NOT NULL, "sitting_id" uuid, "kind" text NOT NULL, "to_address" text NOT NULL, "to_name" text NOT NULL, "subject" text NOT NULL, "body_text" text NOT NULL, "ics" text NOT NULL, "ics_filename" text NOT NULL, "status" text NOT NULL DEFAULT 'queued', "attempts" integer NOT NULL DEFAULT '0', "last_error" text, "message_id" text, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "sent_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "sitting_mail_status" CHECK (status IN ('queued', 'sending', 'sent', 'retrying', 'failed')), CONSTRAINT "sitting_mail_kind" CHECK (kind IN ('invitation', 'change', 'cancellation')), CONSTRAINT "PK_e02989e3fa24408dc841f641aa7" PRIMARY KEY ("id"))`);
    await q.query(`CREATE INDEX "IDX_c65806eb075da201216006a283" ON "sitting_mail"  ("organisation_id") `);
    await q.query(`CREATE INDEX "IDX_5a524ce648375c0352dcb683e9" ON "sitting_mail"  ("sitting_id") `);
    await q.query(`CREATE INDEX "IDX_6e804fb34855e0d4d58238e788" ON "sitting_mail"  ("status", "created_at") `);
    await q.query(`ALTER TABLE "sitting_mail" ADD CONSTRAINT "FK_c65806eb075da201216006a2837" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`);
    await q.query(`ALTER TABLE "sitting_mail" ADD CONSTRAINT "FK_5a524ce648375c0352dcb683e9e" FOREIGN KEY ("sitting_id") REFERENCES "sittings"("id") ON DELETE SET NULL ON UPDATE NO ACTION`);
    await q.query(
      `INSERT INTO sitting_mail (id, organisation_id, sitting_id, kind, to_address, to_name, subject, body_text, ics, ics_filename, status, attempts, last_error, message_id, created_at, sent_at)
       SELECT id, organisation_id, sitting_id, substr(kind, 9), to_address, to_name, data->>'subject', data->>'text', data->>'ics', data->>'icsFilename',
              CASE WHEN status = 'cancelled' THEN 'failed' ELSE status END, attempts, last_error, message_id, created_at, sent_at
         FROM outbound_mail WHERE kind LIKE 'sitting\\_%' AND organisation_id IS NOT NULL`,
    );
    await q.query(`DELETE FROM outbound_mail WHERE kind LIKE 'sitting\\_%'`);
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "outbound_mail_kind"`);
    await q.query(
      `ALTER TABLE "outbound_mail" ADD CONSTRAINT "outbound_mail_kind" CHECK (kind IN ('invitation', 'guardian_notice', 'password_reset', 'results_report', 'third_marking'))`,
    );
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "FK_c947a520e9aec363f77eac2ce8c"`);
    await q.query(`DROP INDEX "public"."IDX_c947a520e9aec363f77eac2ce8"`);
    await q.query(`ALTER TABLE "outbound_mail" DROP COLUMN "sitting_id"`);
  }
}
