import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import type { OrgOwned } from '../../common/org-owned.js';
import { Student } from './student.entity.js';

/** A parent or carer contact of one student; siblings' guardians may share an e-mail. */
@Entity('guardians')
@Check('guardians_email_lower', `email = lower(email)`)
@Index(['organisationId', 'email'])
@Index(['studentId', 'email'], { unique: true })
export class Guardian implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  studentId: string;

  @ManyToOne(() => Student, (s) => s.guardians, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text' })
  email: string;

  /** null = not asked yet; true/false = the guardian's answer. */
  @Column({ type: 'boolean', nullable: true })
  consentResultsEmail: boolean | null;

  @Column({ type: 'boolean', nullable: true })
  consentRecordings: boolean | null;

  @Column({ type: 'timestamptz', nullable: true })
  consentAnsweredAt: Date | null;
}
