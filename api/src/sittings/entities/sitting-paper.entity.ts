import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { RequirementListVersion } from '../../requirement-lists/entities/requirement-list-version.entity.js';
import { Sitting } from './sitting.entity.js';

/**
 * One requirement-list version a sitting uses (typically one per grade), with its slot length:
 * suggested from the list, or fixed by the teacher. Scheduling pins the version.
 */
@Entity('sitting_papers')
@Check('sitting_papers_minutes', `suggested_minutes >= 1 AND (slot_minutes IS NULL OR slot_minutes BETWEEN 2 AND 180)`)
@Index(['sittingId', 'listVersionId'], { unique: true })
export class SittingPaper implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  sittingId: string;

  @ManyToOne(() => Sitting, (s) => s.papers, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sitting_id' })
  sitting?: Relation<Sitting>;

  @Index()
  @Column({ type: 'uuid' })
  listVersionId: string;

  @ManyToOne(() => RequirementListVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'list_version_id' })
  listVersion?: Relation<RequirementListVersion>;

  @Column({ type: 'integer' })
  position: number;

  /** planSlotMinutes for the list plus the sitting's write-up gap, with no access arrangement. */
  @Column({ type: 'integer' })
  suggestedMinutes: number;

  /** The teacher's fixed length for this grade (write-up gap included), or null for the suggestion. */
  @Column({ type: 'integer', nullable: true })
  slotMinutes: number | null;
}
