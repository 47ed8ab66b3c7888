import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { RecordingPurpose } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Slot } from '../../sittings/entities/slot.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * An audio or video recording of a student, for a slot (a recorded exam) or for practice
 * (design.md §3). The bytes live in storage under `storageKey`; the retention job deletes both
 * once `expiresAt` has passed.
 */
@Entity('recordings')
@Check('recordings_purpose', `purpose IN ('slot', 'practice')`)
@Check('recordings_practice_has_no_slot', `purpose = 'slot' OR slot_id IS NULL`)
@Check('recordings_size', `size_bytes > 0`)
@Check('recordings_duration', `duration_seconds IS NULL OR duration_seconds >= 0`)
@Index(['expiresAt'])
@Index(['organisationId', 'studentId'])
export class Recording implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'text' })
  purpose: RecordingPurpose;

  /** Null for practice; set null if a draft slot is removed, so the row (and its retention) stays. */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  slotId: string | null;

  @ManyToOne(() => Slot, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'slot_id' })
  slot?: Relation<Slot | null>;

  @Column({ type: 'uuid' })
  studentId: string;

  @ManyToOne(() => Student, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  @Column({ type: 'uuid', nullable: true })
  uploadedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'uploaded_by_person_id' })
  uploadedBy?: Relation<Person | null>;

  @Index({ unique: true })
  @Column({ type: 'text' })
  storageKey: string;

  /** From the file's content, not its name. */
  @Column({ type: 'text' })
  contentType: string;

  @Column({ type: 'integer' })
  sizeBytes: number;

  @Column({ type: 'real', nullable: true })
  durationSeconds: number | null;

  @Column({ type: 'text' })
  originalName: string;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz' })
  expiresAt: Date;
}
