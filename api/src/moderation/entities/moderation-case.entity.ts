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
import type { ModerationStatus, SheetComparison } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Sitting } from '../../sittings/entities/sitting.entity.js';
import { Slot } from '../../sittings/entities/slot.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * A double-marked pair outside tolerance (design.md §4.5) and how it was resolved: by agreed
 * marks (who, when, why) or by a third marker's blind sheet. Opened when marking closes; while it
 * is open or waiting for the third sheet, the sitting's results cannot be released.
 */
@Entity('moderation_cases')
@Check('moderation_cases_status', `status IN ('open', 'third_marking', 'agreed', 'third')`)
@Check(
  'moderation_cases_agreed',
  `(status = 'agreed') = (agreed_marks IS NOT NULL AND agreed_by_person_id IS NOT NULL AND agreed_reason IS NOT NULL)`,
)
@Check(
  'moderation_cases_third',
  `status NOT IN ('third_marking', 'third') OR third_examiner_membership_id IS NOT NULL`,
)
@Index(['sittingId', 'status'])
export class ModerationCase implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  sittingId: string;

  @ManyToOne(() => Sitting, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting>;

  @Index({ unique: true })
  @Column({ type: 'uuid' })
  slotId: string;

  @ManyToOne(() => Slot, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'slot_id' })
  slot?: Relation<Slot>;

  @Column({ type: 'text', default: 'open' })
  status: ModerationStatus;

  /** compareSheets of the two sheets when the flag was raised (or last refreshed while open). */
  @Column({ type: 'jsonb' })
  comparison: SheetComparison;

  /** Agreed marks by cell ("mark:0:note_accuracy") and the requests agreed as not asked. */
  @Column({ type: 'jsonb', nullable: true })
  agreedMarks: { marks: Record<string, number>; notAsked: number[] } | null;

  @Column({ type: 'uuid', nullable: true })
  agreedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'agreed_by_person_id' })
  agreedBy?: Relation<Person | null>;

  @Column({ type: 'timestamptz', nullable: true })
  agreedAt: Date | null;

  @Column({ type: 'text', nullable: true })
  agreedReason: string | null;

  @Index()
  @Column({ type: 'uuid', nullable: true })
  thirdExaminerMembershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'third_examiner_membership_id' })
  thirdExaminer?: Relation<Membership | null>;

  @Column({ type: 'uuid', nullable: true })
  sentToThirdByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'sent_to_third_by_person_id' })
  sentToThirdBy?: Relation<Person | null>;

  @Column({ type: 'timestamptz', nullable: true })
  sentToThirdAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  resolvedAt: Date | null;
}
