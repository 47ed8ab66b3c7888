import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { Substitution } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * A candidate's approved access arrangement (design.md §3): confidential, so it is reached only
 * through the sittings service, which shows it to the candidate's teachers, admins and the slot's
 * examiners while marking. One per student; changes are audited with before and after.
 */
@Entity('access_arrangements')
@Check('access_arrangements_extra_time', `extra_time_percent BETWEEN 0 AND 100`)
@Check('access_arrangements_rest', `rest_break_minutes BETWEEN 0 AND 60`)
@Index(['studentId'], { unique: true })
export class AccessArrangement implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  studentId: string;

  @ManyToOne(() => Student, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  /** Extra time in percent of the candidate's part of the slot (not the write-up gap). */
  @Column({ type: 'integer', default: 0 })
  extraTimePercent: number;

  /** Rest breaks inside the slot, in minutes, added to its length. */
  @Column({ type: 'integer', default: 0 })
  restBreakMinutes: number;

  /** Approved substitutions, in the shared vocabulary; the draw and the desk apply them. */
  @Column({ type: 'jsonb' })
  substitutions: Substitution[];

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  @UpdateDateColumn({ type: 'timestamptz' })
  updatedAt: Date;

  @Column({ type: 'uuid', nullable: true })
  updatedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by_person_id' })
  updatedBy?: Relation<Person | null>;
}
