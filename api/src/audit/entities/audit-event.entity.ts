import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from '../../users/entities/person.entity.js';
import type { OrgOwned } from '../../common/org-owned.js';

/** Who changed what, from what to what, when (design.md §3). Append-only. */
@Entity('audit_events')
@Index(['organisationId', 'entity', 'entityId'])
export class AuditEvent implements OrgOwned {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid' })
  organisationId: string;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation>;

  @Column({ type: 'uuid', nullable: true })
  actorPersonId: string | null;

  @ManyToOne(() => Person, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'actor_person_id' })
  actor?: Relation<Person | null>;

  @Column({ type: 'text' })
  action: string;

  @Column({ type: 'text' })
  entity: string;

  @Column({ type: 'uuid' })
  entityId: string;

  @Column({ type: 'jsonb', nullable: true })
  before: Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  after: Record<string, unknown> | null;

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date;
}
