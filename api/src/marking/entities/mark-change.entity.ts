import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  type Relation,
} from 'typeorm';
import type { CellValue } from '@stavemark/shared';
import { MarkSheet } from './mark-sheet.entity.js';

/**
 * Every change a client sent, by its change id: a change sent twice (a retry after a lost answer,
 * a queue replayed after a reload) finds its first outcome here and is not applied again.
 * Reached only through its sheet, which carries the organisation.
 */
@Entity('mark_changes')
@Index(['sheetId', 'createdAt'])
export class MarkChange {
  @PrimaryColumn({ type: 'uuid' })
  changeId: string;

  @Column({ type: 'uuid' })
  sheetId: string;

  @ManyToOne(() => MarkSheet, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'sheet_id' })
  sheet?: Relation<MarkSheet>;

  @Column({ type: 'text' })
  cell: string;

  @Column({ type: 'jsonb', nullable: true })
  value: CellValue;

  @Column({ type: 'integer' })
  baseVersion: number;

  /** applied, conflict or correction. */
  @Column({ type: 'text' })
  result: 'applied' | 'conflict' | 'correction';

  /** The cell's version after this change (applied), or the version it met (conflict). */
  @Column({ type: 'integer' })
  version: number;

  /** What the cell held at a conflict, shown to the examiner beside their own value. */
  @Column({ type: 'jsonb', nullable: true })
  theirs: CellValue;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;
}
