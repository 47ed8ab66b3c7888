import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { SlotOutcome } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { Person } from '../../users/entities/person.entity.js';
import { SittingPaper } from './sitting-paper.entity.js';
import { Sitting } from './sitting.entity.js';

/**
 * One candidate's slot in a sitting (design.md §3): planned start and length, who marks it, the
 * outcome, and the attempt it re-sits. Times are instants; the layout is made in the sitting's
 * wall-clock time and stored here after every change.
 */
@Entity('slots')
@Check('slots_outcome', `outcome IS NULL OR outcome IN ('completed', 'absent', 'withdrawn', 'incomplete')`)
@Check('slots_times', `ends_at > starts_at AND minutes >= 1`)
@Check('slots_second_marker', `second_examiner_membership_id IS NULL OR second_examiner_membership_id <> examiner_membership_id`)
@Check('slots_not_before', `not_before IS NULL OR not_before BETWEEN 0 AND 1439`)
@Check('slots_resit', `resit_of_slot_id IS NULL OR resit_of_slot_id <> id`)
@Index(['sittingId', 'position'])
@Index(['organisationId', 'startsAt'])
export class Slot implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  sittingId: string;

  @ManyToOne(() => Sitting, (s) => s.slots, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting>;

  @Index()
  @Column({ type: 'uuid' })
  paperId: string;

  @ManyToOne(() => SittingPaper, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'paper_id' })
  paper?: Relation<SittingPaper>;

  @Index()
  @Column({ type: 'uuid' })
  studentId: string;

  @ManyToOne(() => Student, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  /** Order in the day, from 0. */
  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'timestamptz' })
  startsAt: Date;

  @Column({ type: 'timestamptz' })
  endsAt: Date;

  /** Length in minutes: the paper's, lengthened by the candidate's access arrangement. */
  @Column({ type: 'integer' })
  minutes: number;

  /** Minutes from local midnight before which the slot may not start (a chosen start time). */
  @Column({ type: 'integer', nullable: true })
  notBefore: number | null;

  @Index()
  @Column({ type: 'uuid', nullable: true })
  examinerMembershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'examiner_membership_id' })
  examiner?: Relation<Membership | null>;

  /** Double marking: the second examiner, who marks the same performance independently. */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  secondExaminerMembershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'second_examiner_membership_id' })
  secondExaminer?: Relation<Membership | null>;

  @Column({ type: 'text', nullable: true })
  outcome: SlotOutcome | null;

  @Column({ type: 'text', nullable: true })
  outcomeNote: string | null;

  @Column({ type: 'timestamptz', nullable: true })
  outcomeRecordedAt: Date | null;

  @Column({ type: 'uuid', nullable: true })
  outcomeRecordedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'outcome_recorded_by_person_id' })
  outcomeRecordedBy?: Relation<Person | null>;

  /** The attempt this slot repeats; that slot cannot be removed while this one exists. */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  resitOfSlotId: string | null;

  // NO ACTION (checked at the end of the statement), so a draft sitting with its own re-sits can go.
  @ManyToOne(() => Slot, { onDelete: 'NO ACTION' })
  @JoinColumn({ name: 'resit_of_slot_id' })
  resitOf?: Relation<Slot | null>;

  /** Who went ahead although an examiner of this slot teaches the candidate, and when. */
  @Column({ type: 'uuid', nullable: true })
  ownPupilAckByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'own_pupil_ack_by_person_id' })
  ownPupilAckBy?: Relation<Person | null>;

  @Column({ type: 'timestamptz', nullable: true })
  ownPupilAckAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;
}
