import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Outbound mail (sent after commit through the job queue) and one-time account links (issue 4). */
export class MailAndAccountLinks1796163605141 implements MigrationInterface {
  name = 'MailAndAccountLinks1796163605141';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE "account_tokens" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "purpose" text NOT NULL, "person_id" uuid, "organisation_id" uuid, "guardian_email" text, "token_hash" text, "expires_at" TIMESTAMP WITH TIME ZONE, "used_at" TIMESTAMP WITH TIME ZONE, "revoked_at" TIMESTAMP WITH TIME ZONE, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "account_tokens_target" CHECK ((purpose = 'guardian_consent') = (guardian_email IS NOT NULL AND person_id IS NULL)), CONSTRAINT "account_tokens_purpose" CHECK (purpose IN ('invitation', 'password_reset', 'guardian_consent')), CONSTRAINT "PK_5e3640c493cc6206a44b885e6a9" PRIMARY KEY ("id"))`,
    );
    await q.query(
      `CREATE INDEX "IDX_8ad36405da69116f0518740052" ON "account_tokens"  ("person_id") `,
    );
    await q.query(
      `CREATE UNIQUE INDEX "IDX_ac5cc93075df3c56efbb7bd1ec" ON "account_tokens"  ("token_hash") WHERE token_hash IS NOT NULL`,
    );
    await q.query(
      `CREATE TABLE "outbound_mail" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "organisation_id" uuid, "kind" text NOT NULL, "to_address" text NOT NULL, "to_name" text NOT NULL, "data" jsonb NOT NULL, "account_token_id" uuid, "status" text NOT NULL DEFAULT 'queued', "attempts" integer NOT NULL DEFAULT '0', "last_error" text, "subject" text, "message_id" text, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "sent_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "outbound_mail_status" CHECK (status IN ('queued', 'sending', 'sent', 'retrying', 'failed', 'cancelled')), CONSTRAINT "outbound_mail_kind" CHECK (kind IN ('invitation', 'guardian_notice', 'password_reset')), CONSTRAINT "PK_e7f6d3164f065d081b18f3b324f" PRIMARY KEY ("id"))`,
    );
    await q.query(
      `CREATE INDEX "IDX_7ce39c5ef4d1372b5b46286f0b" ON "outbound_mail"  ("organisation_id") `,
    );
    await q.query(
      `CREATE INDEX "IDX_079cccd0f62aa5d0778399f637" ON "outbound_mail"  ("status", "created_at") `,
    );
    await q.query(
      `ALTER TABLE "account_tokens" ADD CONSTRAINT "FK_8ad36405da69116f0518740052e" FOREIGN KEY ("person_id") REFERENCES "people"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE "account_tokens" ADD CONSTRAINT "FK_243f00f994e8c6d814b79fd730a" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE "outbound_mail" ADD CONSTRAINT "FK_7ce39c5ef4d1372b5b46286f0b0" FOREIGN KEY ("organisation_id") REFERENCES "organisations"("id") ON DELETE CASCADE ON UPDATE NO ACTION`,
    );
    await q.query(
      `ALTER TABLE "outbound_mail" ADD CONSTRAINT "FK_ba03791fe418de3fb2b5d62a24d" FOREIGN KEY ("account_token_id") REFERENCES "account_tokens"("id") ON DELETE SET NULL ON UPDATE NO ACTION`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "FK_ba03791fe418de3fb2b5d62a24d"`);
    await q.query(`ALTER TABLE "outbound_mail" DROP CONSTRAINT "FK_7ce39c5ef4d1372b5b46286f0b0"`);
    await q.query(`ALTER TABLE "account_tokens" DROP CONSTRAINT "FK_243f00f994e8c6d814b79fd730a"`);
    await q.query(`ALTER TABLE "account_tokens" DROP CONSTRAINT "FK_8ad36405da69116f0518740052e"`);
    await q.query(`DROP INDEX "public"."IDX_079cccd0f62aa5d0778399f637"`);
    await q.query(`DROP INDEX "public"."IDX_7ce39c5ef4d1372b5b46286f0b"`);
    await q.query(`DROP TABLE "outbound_mail"`);
    await q.query(`DROP INDEX "public"."IDX_ac5cc93075df3c56efbb7bd1ec"`);
    await q.query(`DROP INDEX "public"."IDX_8ad36405da69116f0518740052"`);
    await q.query(`DROP TABLE "account_tokens"`);
  }
}
