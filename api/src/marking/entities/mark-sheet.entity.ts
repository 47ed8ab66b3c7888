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
import type { MarkSheetStatus } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Slot } from '../../sittings/entities/slot.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';

/** One examiner's marking of one slot (design.md §3): its cells live in mark_cells. */
@Entity('mark_sheets')
@Check('mark_sheets_status', `status IN ('draft', 'submitted')`)
@Check('mark_sheets_role', `role IN ('first', 'second', 'third')`)
@Check('mark_sheets_submitted', `(status = 'submitted') = (submitted_at IS NOT NULL)`)
@Index(['slotId', 'examinerMembershipId'], { unique: true })
export class MarkSheet implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  slotId: string;

  @ManyToOne(() => Slot, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'slot_id' })
  slot?: Relation<Slot>;

  @Index()
  @Column({ type: 'uuid' })
  examinerMembershipId: string;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'examiner_membership_id' })
  examiner?: Relation<Membership>;

  /** third: a moderator's blind sheet for a pair outside tolerance (design.md §4.5). */
  @Column({ type: 'text' })
  role: 'first' | 'second' | 'third';

  @Column({ type: 'text', default: 'draft' })
  status: MarkSheetStatus;

  /** When this examiner started the slot: the desk's countdown runs from here. */
  @CreateDateColumn({ type: 'timestamptz' })
  startedAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  submittedAt: Date | null;
}
