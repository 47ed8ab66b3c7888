import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { SittingBreak, SittingStatus } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { BandPolicyVersion } from './band-policy.entity.js';
import { SittingExaminer } from './sitting-examiner.entity.js';
import { SittingPaper } from './sitting-paper.entity.js';
import { Slot } from './slot.entity.js';

/**
 * A timed mock-exam day in one room (design.md §3). The day's window and every slot are stored as
 * instants; the plan is made in wall-clock time of `timeZone` (the organisation's zone when the
 * sitting was created), so a day on which the clocks change keeps its local times.
 */
@Entity('sittings')
@Check('sittings_status', `status IN ('draft', 'scheduled', 'in_progress', 'marking_closed', 'published')`)
@Check('sittings_window', `ends_at > starts_at`)
@Check('sittings_gaps', `write_up_gap_minutes BETWEEN 0 AND 30 AND changeover_minutes BETWEEN 0 AND 30`)
// Scheduled (and later) sittings have pinned their versions; drafts have not.
@Check('sittings_pinned', `(status = 'draft') = (scheduled_at IS NULL) AND (scheduled_at IS NULL) = (band_policy_id IS NULL)`)
@Index(['organisationId', 'date'])
export class Sitting implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'text' })
  title: string;

  /** The local calendar date in `timeZone`. */
  @Column({ type: 'date' })
  date: string;

  @Column({ type: 'text' })
  room: string;

  @Column({ type: 'text' })
  timeZone: string;

  /** When the first slot may start and the last must have ended. */
  @Column({ type: 'timestamptz' })
  startsAt: Date;

  @Column({ type: 'timestamptz' })
  endsAt: Date;

  /** Wall-clock breaks of the day ("10:30"–"10:45"), the way the plan is made. */
  @Column({ type: 'jsonb' })
  breaks: SittingBreak[];

  @Column({ type: 'integer' })
  writeUpGapMinutes: number;

  @Column({ type: 'integer' })
  changeoverMinutes: number;

  @Column({ type: 'text', default: 'draft' })
  status: SittingStatus;

  /** Who planned it; they (and admins) may change it. */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  plannedByMembershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'planned_by_membership_id' })
  plannedBy?: Relation<Membership | null>;

  @Column({ type: 'timestamptz', nullable: true })
  scheduledAt: Date | null;

  /** Pinned when scheduled, with the requirement-list versions (papers) and rubric versions. */
  @Column({ type: 'uuid', nullable: true })
  bandPolicyId: string | null;

  @ManyToOne(() => BandPolicyVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'band_policy_id' })
  bandPolicy?: Relation<BandPolicyVersion | null>;

  @Column({ type: 'uuid', array: true, nullable: true })
  pinnedRubricVersionIds: string[] | null;

  /**
   * Bumped by every change to the plan; calendar files use it as RFC 5545 SEQUENCE, so a changed
   * invitation replaces the one a calendar already holds.
   */
  @Column({ type: 'integer', default: 0 })
  revision: number;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @OneToMany(() => SittingPaper, (p) => p.sitting)
  papers?: Relation<SittingPaper[]>;

  @OneToMany(() => SittingExaminer, (e) => e.sitting)
  examiners?: Relation<SittingExaminer[]>;

  @OneToMany(() => Slot, (s) => s.sitting)
  slots?: Relation<Slot[]>;

  /** A recorded exam: candidates may upload their own recording for their slot (issue 6 §6). */
  @Column({ type: 'boolean', default: false })
  recordedExam: boolean;
}
