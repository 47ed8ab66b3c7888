import {
  Check,
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { LevelDescriptor } from '@stavemark/shared';
import { RubricVersion } from './rubric-version.entity.js';

/**
 * One criterion of a rubric version. Reached only through its version (which carries the
 * organisation), so it has no organisation column of its own. The checks repeat the request
 * shape's limits, so no other path into the table can store a weight ≤ 0 or a maximum over 10.
 */
@Entity('rubric_criteria')
@Check('rubric_criteria_weight', `weight > 0`)
@Check('rubric_criteria_max_mark', `max_mark BETWEEN 1 AND 10`)
@Index(['rubricVersionId', 'key'], { unique: true })
@Index(['rubricVersionId', 'position'], { unique: true })
export class RubricCriterionRow {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  rubricVersionId: string;

  @ManyToOne(() => RubricVersion, (v) => v.criteria, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'rubric_version_id' })
  rubricVersion?: Relation<RubricVersion>;

  /** Order shown on the mark sheet, from 0. */
  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'text' })
  key: string;

  @Column({ type: 'text' })
  label: string;

  @Column({ type: 'text', nullable: true })
  description: string | null;

  @Column({ type: 'double precision' })
  weight: number;

  @Column({ type: 'integer' })
  maxMark: number;

  /** A level descriptor per mark or per band of marks, as validated by the request shape. */
  @Column({ type: 'jsonb' })
  descriptors: LevelDescriptor[];
}
