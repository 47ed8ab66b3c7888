import { Check, Column, Entity, Index, JoinColumn, JoinTable, ManyToMany, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Term } from '../../organisations/entities/term.entity.js';
import type { OrgOwned } from '../../common/org-owned.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { Student } from '../../students/entities/student.entity.js';

/** A teaching class ("class" is a reserved word in TypeScript, hence the name). */
@Entity('classes')
@Check('classes_grade', `grade BETWEEN 0 AND 12`)
@Index(['organisationId', 'code'], { unique: true })
export class ClassGroup implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid', nullable: true })
  termId: string | null;

  @ManyToOne(() => Term, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'term_id' })
  term?: Relation<Term | null>;

  @Column({ type: 'text' })
  name: string;

  /** Short code used in CSV imports, unique in the organisation. */
  @Column({ type: 'text' })
  code: string;

  @Column({ type: 'integer', nullable: true })
  grade: number | null;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  /** Teachers are memberships (a person's place in this organisation). */
  @ManyToMany(() => Membership)
  @JoinTable({
    name: 'class_teachers',
    joinColumn: { name: 'class_id' },
    inverseJoinColumn: { name: 'membership_id' },
  })
  teachers?: Relation<Membership[]>;

  @ManyToMany(() => Student, (s) => s.classes)
  @JoinTable({
    name: 'class_members',
    joinColumn: { name: 'class_id' },
    inverseJoinColumn: { name: 'student_id' },
  })
  students?: Relation<Student[]>;
}
