import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToMany, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import type { OrgOwned } from '../../common/org-owned.js';
import { ClassGroup } from '../../classes/entities/class-group.entity.js';
import { Guardian } from './guardian.entity.js';

/** A learner. Young children may have no sign-in of their own (membershipId null). */
@Entity('students')
@Check('students_grade', `grade BETWEEN 0 AND 12`)
@Check('students_email_lower', `email = lower(email)`)
@Index(['organisationId', 'pupilNumber'], { unique: true })
export class Student implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Index({ unique: true, where: 'membership_id IS NOT NULL' })
  @Column({ type: 'uuid', nullable: true })
  membershipId: string | null;

  @ManyToOne(() => Membership, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'membership_id' })
  membership?: Relation<Membership | null>;

  @Column({ type: 'text' })
  pupilNumber: string;

  @Column({ type: 'text' })
  givenName: string;

  @Column({ type: 'text' })
  familyName: string;

  @Column({ type: 'text', nullable: true })
  email: string | null;

  @Column({ type: 'date' })
  dateOfBirth: string;

  @Column({ type: 'integer', nullable: true })
  grade: number | null;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @ManyToMany(() => ClassGroup, (c) => c.students)
  classes?: Relation<ClassGroup[]>;

  @OneToMany(() => Guardian, (g) => g.student)
  guardians?: Relation<Guardian[]>;
}
