import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Person } from '../../users/entities/person.entity.js';

export const TOKEN_PURPOSES = ['invitation', 'password_reset', 'guardian_consent'] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

/**
 * A one-time link: an invitation to set a first password, a password reset, or a guardian's
 * consent request. Only the SHA-256 of the token is kept; it is minted when the e-mail is sent
 * (hash and expiry null until then) and can be used once.
 */
@Entity('account_tokens')
@Check('account_tokens_purpose', `purpose IN ('invitation', 'password_reset', 'guardian_consent')`)
@Check(
  'account_tokens_target',
  `(purpose = 'guardian_consent') = (guardian_email IS NOT NULL AND person_id IS NULL)`,
)
@Index(['tokenHash'], { unique: true, where: 'token_hash IS NOT NULL' })
export class AccountToken {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text' })
  purpose: TokenPurpose;

  /** Whose password the link sets (invitation, reset). */
  @Index()
  @Column({ type: 'uuid', nullable: true })
  personId: string | null;

  @ManyToOne(() => Person, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'person_id' })
  person?: Relation<Person | null>;

  /** The organisation that invited or asks for consent; null for a reset. */
  @Column({ type: 'uuid', nullable: true })
  organisationId: string | null;

  @ManyToOne(() => Organisation, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation?: Relation<Organisation | null>;

  /** The guardian address a consent link is for (all of that guardian's children in the organisation). */
  @Column({ type: 'text', nullable: true })
  guardianEmail: string | null;

  @Column({ type: 'text', nullable: true })
  tokenHash: string | null;

  @Column({ type: 'timestamptz', nullable: true })
  expiresAt: Date | null;

  @Column({ type: 'timestamptz', nullable: true })
  usedAt: Date | null;

  /** Set when a newer link or a new password makes this one pointless. */
  @Column({ type: 'timestamptz', nullable: true })
  revokedAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz' })
  createdAt: Date;
}
