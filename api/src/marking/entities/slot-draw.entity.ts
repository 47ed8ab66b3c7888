import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { Request } from '@stavemark/shared';
import type { OrgOwned } from '../../common/org-owned.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Slot } from '../../sittings/entities/slot.entity.js';
import { Person } from '../../users/entities/person.entity.js';

/** A change the examiner made to a drawn request, with the reason (design.md §4.4). */
export interface RequestChange {
  index: number;
  reason: string;
  byPersonId: string;
  byName: string;
  at: string;
  before: Partial<Request>;
  after: Partial<Request>;
}

/**
 * The draw of one slot (design.md §4.4): the seed and algorithm, so it can be replayed, and the
 * requests as drawn (`drawn`) and as asked after the examiner's changes (`requests`). Both
 * examiners of a double-marked slot mark the same performance, so there is one draw per slot.
 */
@Entity('slot_draws')
@Index(['slotId'], { unique: true })
export class SlotDraw implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid' })
  slotId: string;

  @ManyToOne(() => Slot, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'slot_id' })
  slot?: Relation<Slot>;

  @Index()
  @Column({ type: 'uuid' })
  studentId: string;

  @Column({ type: 'text' })
  seed: string;

  @Column({ type: 'text' })
  algorithm: string;

  @Column({ type: 'jsonb' })
  drawn: Request[];

  @Column({ type: 'jsonb' })
  requests: Request[];

  @Column({ type: 'jsonb', default: () => `'[]'` })
  changes: RequestChange[];

  @Column({ type: 'integer', default: 0 })
  repeatsOfPrevious: number;

  @Column({ type: 'uuid', nullable: true })
  drawnByPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'drawn_by_person_id' })
  drawnBy?: Relation<Person | null>;

  @CreateDateColumn({ type: 'timestamptz' })
  drawnAt: Date;
}
