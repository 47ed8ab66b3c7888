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
import { RubricVersion } from './rubric-version.entity.js';

/** A rubric's identity across its versions; what it says lives in its versions. */
@Entity('rubrics')
@Index(['organisationId', 'starterKey'], { unique: true, where: 'starter_key IS NOT NULL' })
export class Rubric implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  /** The starter-library file it was seeded from (so seeding twice adds nothing). */
  @Column({ type: 'text', nullable: true })
  starterKey: string | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @OneToMany(() => RubricVersion, (v) => v.rubric)
  versions?: Relation<RubricVersion[]>;
}
