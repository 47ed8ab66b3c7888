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
import type { Direction, Hand, Inversion, Mode, RequestKind } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * A student's approved fingering for one kind, key, mode, hand and inversion. Append-only: a
 * change is a new row with the next revision; the highest revision is the current fingering.
 */
@Entity('student_fingerings')
@Check('student_fingerings_hand', `hand IN ('RH', 'LH')`)
@Check(
  'student_fingerings_digits',
  `cardinality(digits) > 0 AND digits <@ ARRAY[1, 2, 3, 4, 5]::smallint[]`,
)
@Check('student_fingerings_revision', `revision >= 1`)
// `request` spells kind|key|mode|hand|inversion in one column so the unique index treats
// "no mode" and "no inversion" as values (NULLs would never collide).
@Index(['studentId', 'request', 'revision'], { unique: true })
export class StudentFingering implements OrgOwned {
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

  @Column({ type: 'text' })
  request: string;

  @Column({ type: 'text' })
  kind: RequestKind;

  /** Normalised key or starting note (e.g. "F#", "Bb"). */
  @Column({ type: 'text' })
  key: string;

  @Column({ type: 'text', nullable: true })
  mode: Mode | null;

  @Column({ type: 'text' })
  hand: Hand;

  @Column({ type: 'text', nullable: true })
  inversion: Inversion | null;

  @Column({ type: 'integer' })
  octaves: number;

  @Column({ type: 'text' })
  direction: Direction;

  @Column({ type: 'smallint', array: true })
  digits: number[];

  @Column({ type: 'text', nullable: true })
  note: string | null;

  @Column({ type: 'integer' })
  revision: number;

  @Column({ type: 'uuid', nullable: true })
  setByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'set_by_person_id' })
  setBy?: Relation<Person | null>;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;
}
