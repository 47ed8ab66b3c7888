import {
  Check,
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { ResultBasis, ResultProfile } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { RequirementListVersion } from '../../requirement-lists/entities/requirement-list-version.entity.js';
import { BandPolicyVersion } from '../../sittings/entities/band-policy.entity.js';
import { Sitting } from '../../sittings/entities/sitting.entity.js';
import { Slot } from '../../sittings/entities/slot.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * One candidate's result in a sitting (design.md §3), derived from submitted mark sheets when
 * marking closes. It names the list and band-policy versions and the scoring rule it was computed
 * with, and which marks it came from, so it can be recomputed from the marks at any time.
 */
@Entity('results')
@Check('results_basis', `basis IN ('single', 'first', 'agreed', 'third')`)
@Check('results_total', `total >= 0 AND out_of > 0 AND total <= out_of`)
@Index(['organisationId', 'studentId', 'computedAt'])
@Index(['sittingId'])
export class Result implements OrgOwned {
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

  @Column({ type: 'uuid' })
  studentId: string;

  @ManyToOne(() => Student, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  @Column({ type: 'uuid' })
  listVersionId: string;

  @ManyToOne(() => RequirementListVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'list_version_id' })
  listVersion?: Relation<RequirementListVersion>;

  @Column({ type: 'uuid' })
  bandPolicyVersionId: string;

  @ManyToOne(() => BandPolicyVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'band_policy_version_id' })
  bandPolicyVersion?: Relation<BandPolicyVersion>;

  /** RESULT_RULE_VERSION at the time of computing. */
  @Column({ type: 'text' })
  ruleVersion: string;

  @Column({ type: 'text' })
  basis: ResultBasis;

  @Column({ type: 'integer' })
  total: number;

  @Column({ type: 'integer' })
  outOf: number;

  /** total ÷ outOf × 100, unrounded (double precision, read back as a number). */
  @Column({ type: 'double precision' })
  percentage: number;

  @Column({ type: 'text' })
  bandKey: string;

  @Column({ type: 'text' })
  bandLabel: string;

  @Column({ type: 'jsonb' })
  profile: ResultProfile;

  /** Fingering slips flagged on the sheet the result came from. */
  @Column({ type: 'integer', default: 0 })
  slips: number;

  /** Notes played over the asked scales and arpeggios (both hands together count twice); null when none counted. */
  @Column({ type: 'integer', nullable: true })
  notesPlayed: number | null;

  @Column({ type: 'timestamptz' })
  computedAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  releasedAt: Date | null;

  @Column({ type: 'uuid', nullable: true })
  releasedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'released_by_person_id' })
  releasedBy?: Relation<Person | null>;

  /** The teacher's note for the student, written at release and shown in the take-home report. */
  @Column({ type: 'text', nullable: true })
  teacherNote: string | null;
}
