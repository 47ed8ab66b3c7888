import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { BandThreshold } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/**
 * One version of an organisation's band policy (design.md §4.1). Append-only: an admin's edit is
 * a new version, and a scheduled sitting pins the version it was scheduled under.
 */
@Entity('band_policies')
@Check('band_policies_version', `version >= 1`)
@Index(['organisationId', 'version'], { unique: true })
export class BandPolicyVersion implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'integer' })
  version: number;

  /** Highest threshold first, as validated by bandPolicyBodySchema. */
  @Column({ type: 'jsonb' })
  bands: BandThreshold[];

  @Column({ type: 'jsonb' })
  below: { key: string; label: string };

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'uuid', nullable: true })
  createdByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by_person_id' })
  createdBy?: Relation<Person | null>;
}
