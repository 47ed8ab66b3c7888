import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organisation } from './organisation.entity.js';
import type { OrgOwned } from '../../common/org-owned.js';

@Entity('terms')
@Check('terms_dates', `ends_on >= starts_on`)
@Index(['organisationId', 'name'], { unique: true })
export class Term implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  /** e.g. "Autumn 2026" */
  @Column({ type: 'text' })
  name: string;

  /** e.g. "2026-27" */
  @Column({ type: 'text' })
  academicYear: string;

  @Column({ type: 'date' })
  startsOn: string;

  @Column({ type: 'date' })
  endsOn: string;
}
