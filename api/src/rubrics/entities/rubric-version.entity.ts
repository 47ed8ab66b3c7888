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
import type { RequestKind, VersionStatus } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from '../../users/entities/person.entity.js';
import { RubricCriterionRow } from './rubric-criterion.entity.js';
import { Rubric } from './rubric.entity.js';

/** One version of a rubric. Published versions never change: marks and lists pin them. */
@Entity('rubric_versions')
@Check('rubric_versions_status', `status IN ('draft', 'published')`)
@Check('rubric_versions_published', `(status = 'published') = (published_at IS NOT NULL)`)
@Check('rubric_versions_kinds', `cardinality(kinds) > 0`)
@Index(['rubricId', 'version'], { unique: true })
// At most one draft per rubric: an edit of a published version starts the one draft.
@Index('rubric_versions_one_draft', ['rubricId'], { unique: true, where: `status = 'draft'` })
export class RubricVersion implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  rubricId: string;

  @ManyToOne(() => Rubric, (r) => r.versions, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'rubric_id' })
  rubric?: Relation<Rubric>;

  @Column({ type: 'integer' })
  version: number;

  @Column({ type: 'text', default: 'draft' })
  status: VersionStatus;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', array: true })
  kinds: RequestKind[];

  @OneToMany(() => RubricCriterionRow, (c) => c.rubricVersion, { cascade: ['insert'] })
  criteria?: Relation<RubricCriterionRow[]>;

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
}
