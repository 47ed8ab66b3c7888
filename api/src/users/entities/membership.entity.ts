import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { Role } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from './person.entity.js';

/** A person's place in one organisation, with the roles they hold there. */
@Entity('memberships')
@Check('memberships_roles', `cardinality(roles) > 0 AND roles <@ ARRAY['admin', 'teacher', 'examiner', 'student']::text[]`)
@Index(['organisationId', 'personId'], { unique: true })
export class Membership implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Index()
  @Column({ type: 'uuid' })
  personId: string;

  @ManyToOne(() => Person, (p) => p.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'person_id' })
  person?: Relation<Person>;

  @Column({ type: 'text', array: true })
  roles: Role[];

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;
}
