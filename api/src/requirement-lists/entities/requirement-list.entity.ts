import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  OneToMany,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { RequirementListVersion } from './requirement-list-version.entity.js';

/** A grade's requirement list across its versions (the lineage progress is measured in). */
@Entity('requirement_lists')
@Index(['organisationId', 'starterKey'], { unique: true, where: 'starter_key IS NOT NULL' })
export class RequirementList implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'text', nullable: true })
  starterKey: string | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @OneToMany(() => RequirementListVersion, (v) => v.list)
  versions?: Relation<RequirementListVersion[]>;
}
