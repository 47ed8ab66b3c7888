import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import type { CellValue } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { MarkSheet } from './mark-sheet.entity.js';

/**
 * One cell of a mark sheet (design.md §7): a mark (request × criterion), a flag count, a comment,
 * "asked" or the outcome. `version` rises by one per applied change; a save based on an older
 * version of this same cell is a conflict, while saves to other cells never conflict.
 */
@Entity('mark_cells')
@Index(['sheetId', 'cell'], { unique: true })
export class MarkCell implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

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
  version: number;

  @Column({ type: 'uuid' })
  lastChangeId: string;

  @UpdateDateColumn({ type: 'timestamptz' })
  updatedAt: Date;
}
