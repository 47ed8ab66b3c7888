import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Sitting } from './sitting.entity.js';

export const SITTING_MAIL_KINDS = ['invitation', 'change', 'cancellation'] as const;
export type SittingMailKind = (typeof SITTING_MAIL_KINDS)[number];

/**
 * A sitting invitation with its calendar file, written in the transaction of the change that
 * causes it and sent after commit by the job queue. Shaped like OutboundMail (status, attempts,
 * last error, message id) so both can be folded into one table once OutboundMail carries
 * attachments and this kind; until then sittings keep their own (see sitting-mailer.ts).
 */
@Entity('sitting_mail')
@Check('sitting_mail_kind', `kind IN ('invitation', 'change', 'cancellation')`)
@Check('sitting_mail_status', `status IN ('queued', 'sending', 'sent', 'retrying', 'failed')`)
@Index(['status', 'createdAt'])
export class SittingMail implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Index()
  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Index()
  @Column({ type: 'uuid', nullable: true })
  sittingId: string | null;

  @ManyToOne(() => Sitting, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting | null>;

  @Column({ type: 'text' })
  kind: SittingMailKind;

  @Column({ type: 'text' })
  toAddress: string;

  @Column({ type: 'text' })
  toName: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text' })
  bodyText: string;

  /** The RFC 5545 calendar file sent as an attachment. */
  @Column({ type: 'text' })
  ics: string;

  @Column({ type: 'text' })
  icsFilename: string;

  @Column({ type: 'text', default: 'queued' })
  status: 'queued' | 'sending' | 'sent' | 'retrying' | 'failed';

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'text', nullable: true })
  lastError: string | null;

  @Column({ type: 'text', nullable: true })
  messageId: string | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  sentAt: Date | null;
}
