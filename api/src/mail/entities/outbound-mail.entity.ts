import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { AccountToken } from '../../invitations/entities/account-token.entity.js';
import { Sitting } from '../../sittings/entities/sitting.entity.js';

export const MAIL_KINDS = [
  'invitation',
  'guardian_notice',
  'password_reset',
  'results_report',
  'third_marking',
  // A sitting's invitation, change or cancellation, each with its calendar file (RFC 5545).
  'sitting_invitation',
  'sitting_change',
  'sitting_cancellation',
] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
export const MAIL_STATUSES = [
  'queued',
  'sending',
  'sent',
  'retrying',
  'failed',
  'cancelled',
] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/**
 * Every e-mail the product sends (design.md §3, §7): written in the same transaction as the
 * change that causes it, sent after commit by the job queue. The body is rendered when it is
 * sent, from the kind and `data`; a one-time link is minted then too, so no usable token is ever
 * stored here.
 */
@Entity('outbound_mail')
@Check(
  'outbound_mail_kind',
  `kind IN ('invitation', 'guardian_notice', 'password_reset', 'results_report', 'third_marking', 'sitting_invitation', 'sitting_change', 'sitting_cancellation')`,
)
@Check(
  'outbound_mail_status',
  `status IN ('queued', 'sending', 'sent', 'retrying', 'failed', 'cancelled')`,
)
@Index(['status', 'createdAt'])
export class OutboundMail {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** Null for mail about a person rather than one organisation (a password reset). */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  organisationId: string | null;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation | null>;

  @Column({ type: 'text' })
  kind: MailKind;

  /** The sitting a sitting mail is about (kept when the sitting is deleted, as history). */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  sittingId: string | null;

  @ManyToOne(() => Sitting, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting | null>;

  @Column({ type: 'text' })
  toAddress: string;

  @Column({ type: 'text' })
  toName: string;

  /** Names and facts the template needs; never a secret. */
  @Column({ type: 'jsonb' })
  data: Record<string, unknown>;

  /** The one-time link this mail carries, minted at send time. */
  @Column({ type: 'uuid', nullable: true })
  accountTokenId: string | null;

  @ManyToOne(() => AccountToken, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'account_token_id' })
  accountToken?: Relation<AccountToken | null>;

  @Column({ type: 'text', default: 'queued' })
  status: MailStatus;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'text', nullable: true })
  lastError: string | null;

  /** Subject as sent (set when rendered). */
  @Column({ type: 'text', nullable: true })
  subject: string | null;

  @Column({ type: 'text', nullable: true })
  messageId: string | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  sentAt: Date | null;
}
