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
import type {
  Articulation,
  BeatUnit,
  Direction,
  Dynamic,
  Hands,
  Inversion,
  Mode,
  Motion,
  RequestKind,
} from '@stavemark/shared';
import { RubricVersion } from '../../rubrics/entities/rubric-version.entity.js';
import { RequirementListVersion } from './requirement-list-version.entity.js';

/**
 * One line of a requirement list version: a template of what may be asked. Reached only through
 * its version (which carries the organisation). Option lists are text arrays in the shared
 * vocabulary; the request shape validates them.
 */
@Entity('requirement_lines')
@Check(
  'requirement_lines_kind',
  `kind IN ('scale', 'arpeggio', 'broken_chord', 'chromatic', 'dominant_seventh', 'diminished_seventh', 'passage', 'other')`,
)
@Check('requirement_lines_tempo', `tempo_bpm > 0 AND tempo_notes_per_beat >= 1`)
@Check('requirement_lines_weight', `difficulty_weight > 0`)
@Index(['listVersionId', 'position'], { unique: true })
export class RequirementLineRow {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  listVersionId: string;

  @ManyToOne(() => RequirementListVersion, (v) => v.lines, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'list_version_id' })
  listVersion?: Relation<RequirementListVersion>;

  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'text' })
  kind: RequestKind;

  @Column({ type: 'text', nullable: true })
  label: string | null;

  @Column({ type: 'text', array: true })
  keys: string[];

  @Column({ type: 'text', array: true })
  modes: Mode[];

  @Column({ type: 'text', array: true })
  hands: Hands[];

  @Column({ type: 'text', array: true })
  motions: Motion[];

  @Column({ type: 'integer', array: true })
  octaves: number[];

  /** Null: up and down (the default of the shared computations). */
  @Column({ type: 'text', array: true, nullable: true })
  directions: Direction[] | null;

  @Column({ type: 'text', array: true })
  articulations: Articulation[];

  @Column({ type: 'text', array: true })
  dynamics: Dynamic[];

  @Column({ type: 'text', array: true })
  inversions: Inversion[];

  @Column({ type: 'double precision' })
  tempoBpm: number;

  @Column({ type: 'text' })
  tempoBeatUnit: BeatUnit;

  @Column({ type: 'integer' })
  tempoNotesPerBeat: number;

  /** The rubric version requests from this line are marked with; never deleted while used. */
  @Index()
  @Column({ type: 'uuid' })
  rubricVersionId: string;

  @ManyToOne(() => RubricVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'rubric_version_id' })
  rubricVersion?: Relation<RubricVersion>;

  @Column({ type: 'double precision' })
  difficultyWeight: number;

  @Column({ type: 'text', array: true, nullable: true })
  titles: string[] | null;

  @Column({ type: 'double precision', nullable: true })
  durationSeconds: number | null;
}
