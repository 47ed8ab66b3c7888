import { Check, Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { NoteNameConvention } from '@stavemark/shared';
import { Membership } from './membership.entity.js';

/** One human with one sign-in, possibly a member of several organisations. Not org-owned. */
@Entity('people')
@Check('people_email_lower', `email = lower(email)`)
@Check('people_note_names', `note_names IN ('british', 'american')`)
export class Person {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** Stored lower-case; unique across the whole product. */
  @Column({ type: 'text', unique: true })
  email: string;

  /** Null until the person sets a password through an invitation. */
  @Column({ type: 'text', nullable: true, select: false })
  passwordHash: string | null;

  /** Bumped on deactivation or password change: every older token stops working. */
  @Column({ type: 'integer', default: 0 })
  tokenVersion: number;

  @Column({ type: 'text' })
  displayName: string;

  @Column({ type: 'text', default: 'british' })
  noteNames: NoteNameConvention;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;

  @Column({ type: 'timestamptz', nullable: true })
  lastSignInAt: Date | null;

  @OneToMany(() => Membership, (m) => m.person)
  memberships?: Relation<Membership[]>;
}
