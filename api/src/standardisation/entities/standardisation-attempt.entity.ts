import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { AttemptStatus, ExerciseMark } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { StandardisationExercise } from './standardisation-exercise.entity.js';

/** One examiner's blind marking of an exercise; fixed once submitted. */
@Entity('standardisation_attempts')
@Check('standardisation_attempts_status', `status IN ('draft', 'submitted')`)
@Check('standardisation_attempts_submitted', `(status = 'submitted') = (submitted_at IS NOT NULL)`)
@Index(['exerciseId', 'examinerMembershipId'], { unique: true })
export class StandardisationAttempt implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  exerciseId: string;

  @ManyToOne(() => StandardisationExercise, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'exercise_id' })
  exercise?: Relation<StandardisationExercise>;

  @Index()
  @Column({ type: 'uuid' })
  examinerMembershipId: string;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'examiner_membership_id' })
  examiner?: Relation<Membership>;

  @Column({ type: 'jsonb', default: () => `'[]'` })
  marks: ExerciseMark[];

  @Column({ type: 'text', default: 'draft' })
  status: AttemptStatus;

  @CreateDateColumn({ type: 'timestamptz' })
  startedAt: Date;

  @UpdateDateColumn({ type: 'timestamptz' })
  updatedAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  submittedAt: Date | null;
}
