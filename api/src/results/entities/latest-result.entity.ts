import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  type Relation,
} from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { Result } from './result.entity.js';

/**
 * Each student's latest result per requirement-list lineage and grade (issue 8 §7), kept beside
 * `results` in the same transaction by ResultsService.refreshLatest, so the progress percentile
 * counts one row per peer on an index range instead of finding every peer's latest result.
 * Derived data: it can always be rebuilt from `results`. Keyed by student, lineage and grade (no
 * id, so not OrgOwned); read and written only by organisation-scoped SQL.
 */
@Entity('latest_results')
@Index(['organisationId', 'listId', 'grade', 'percentage', 'computedAt'])
export class LatestResult {
  @PrimaryColumn({ type: 'uuid' })
  studentId: string;

  /** The lineage: requirement_list_versions.list_id of the result's list version. */
  @PrimaryColumn({ type: 'uuid' })
  listId: string;

  @PrimaryColumn({ type: 'text' })
  grade: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @ManyToOne(() => Student, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'student_id' })
  student?: Relation<Student>;

  @Index({ unique: true })
  @Column({ type: 'uuid' })
  resultId: string;

  // A result removed by a path that skips refreshLatest takes its row with it rather than leave a stale one.
  @ManyToOne(() => Result, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'result_id' })
  result?: Relation<Result>;

  @Column({ type: 'double precision' })
  percentage: number;

  @Column({ type: 'timestamptz' })
  computedAt: Date;
}
