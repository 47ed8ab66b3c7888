import {
  Check,
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
import type { SelectionRule, VersionStatus } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from '../../users/entities/person.entity.js';
import { RequirementLineRow } from './requirement-line.entity.js';
import { RequirementList } from './requirement-list.entity.js';

/**
 * One version of a requirement list. Drafts change freely; a published version is fixed, and
 * once a sitting pins it (`usedAt`) it can never change or be withdrawn.
 */
@Entity('requirement_list_versions')
@Check('requirement_list_versions_status', `status IN ('draft', 'published')`)
@Check('requirement_list_versions_published', `(status = 'published') = (published_at IS NOT NULL)`)
@Check('requirement_list_versions_used', `used_at IS NULL OR status = 'published'`)
@Check('requirement_list_versions_total', `total_marks > 0`)
@Index(['listId', 'version'], { unique: true })
@Index('requirement_list_versions_one_draft', ['listId'], {
  unique: true,
  where: `status = 'draft'`,
})
@Index(['organisationId', 'grade'])
export class RequirementListVersion implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  listId: string;

  @ManyToOne(() => RequirementList, (l) => l.versions, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'list_id' })
  list?: Relation<RequirementList>;

  @Column({ type: 'integer' })
  version: number;

  @Column({ type: 'text', default: 'draft' })
  status: VersionStatus;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text' })
  grade: string;

  @Column({ type: 'integer' })
  totalMarks: number;

  @Column({ type: 'jsonb' })
  selectionRule: SelectionRule;

  @OneToMany(() => RequirementLineRow, (l) => l.listVersion, { cascade: ['insert'] })
  lines?: Relation<RequirementLineRow[]>;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'uuid', nullable: true })
  createdByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by_person_id' })
  createdBy?: Relation<Person | null>;

  @Column({ type: 'timestamptz', nullable: true })
  publishedAt: Date | null;

  @Column({ type: 'uuid', nullable: true })
  publishedByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'published_by_person_id' })
  publishedBy?: Relation<Person | null>;

  /** When a sitting first pinned this version (RequirementListsService.markUsed). */
  @Column({ type: 'timestamptz', nullable: true })
  usedAt: Date | null;
}
