import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ExerciseMark, ExerciseRequest, ExerciseStatus } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { RubricVersion } from '../../rubrics/entities/rubric-version.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';

/**
 * A reference performance for standardising examiners (design.md §3 ReferenceRecording): what
 * was asked, the rubric version to mark it on, and the reference marks. Published exercises are
 * fixed, so every attempt is compared with the same reference.
 */
@Entity('standardisation_exercises')
@Check('standardisation_exercises_status', `status IN ('draft', 'published')`)
@Check('standardisation_exercises_published', `(status = 'published') = (published_at IS NOT NULL)`)
@Check('standardisation_exercises_recording', `(recording_key IS NULL) = (recording_content_type IS NULL)`)
@Index(['organisationId', 'status'])
export class StandardisationExercise implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'text' })
  title: string;

  @Column({ type: 'text', default: '' })
  instructions: string;

  @Index()
  @Column({ type: 'uuid' })
  rubricVersionId: string;

  @ManyToOne(() => RubricVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'rubric_version_id' })
  rubricVersion?: Relation<RubricVersion>;

  /** The requests performed on the recording, in order. */
  @Column({ type: 'jsonb' })
  requests: ExerciseRequest[];

  /** Request × criterion reference marks; never sent to an examiner before they submit. */
  @Column({ type: 'jsonb', default: () => `'[]'` })
  referenceMarks: ExerciseMark[];

  /** The reference performance in storage (api/src/storage): its key, type from its bytes, size. */
  @Column({ type: 'text', nullable: true })
  recordingKey: string | null;

  @Column({ type: 'text', nullable: true })
  recordingContentType: string | null;

  @Column({ type: 'integer', nullable: true })
  recordingBytes: number | null;

  @Column({ type: 'double precision', nullable: true })
  recordingDurationSeconds: number | null;

  @Column({ type: 'text', default: 'draft' })
  status: ExerciseStatus;

  @Column({ type: 'date', nullable: true })
  dueOn: string | null;

  @Index()
  @Column({ type: 'uuid', nullable: true })
  createdByMembershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by_membership_id' })
  createdBy?: Relation<Membership | null>;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  publishedAt: Date | null;
}
