import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Membership } from '../../users/entities/membership.entity.js';
import { Sitting } from './sitting.entity.js';

/** An examiner on a sitting's panel; position 0 leads (marks every slot unless it says otherwise). */
@Entity('sitting_examiners')
@Index(['sittingId', 'membershipId'], { unique: true })
export class SittingExaminer implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  sittingId: string;

  @ManyToOne(() => Sitting, (s) => s.examiners, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting>;

  @Index()
  @Column({ type: 'uuid' })
  membershipId: string;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'membership_id' })
  membership?: Relation<Membership>;

  @Column({ type: 'integer' })
  position: number;
}
