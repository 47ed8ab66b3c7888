import { Inject, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, IsNull, MoreThan, type EntityManager } from 'typeorm';
import type {
  AccountMessage,
  ConsentRequest,
  ForgotPasswordInput,
  LinkInfo,
  SetPasswordInput,
  SubmitConsentInput,
} from '@stavemark/shared';
import { AuditEvent } from '../audit/entities/audit-event.entity.js';
import { hashPassword } from '../auth/passwords.js';
import { TokenService } from '../auth/token.service.js';
import { bulkInsert } from '../common/bulk-sql.js';
import { now } from '../common/clock.js';
import { invalid } from '../common/errors.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { MailService } from '../mail/mail.service.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Guardian } from '../students/entities/guardian.entity.js';
import { Person } from '../users/entities/person.entity.js';
import { AccountToken, type TokenPurpose } from './entities/account-token.entity.js';
import { hashLinkToken } from './link-tokens.js';

export interface NewLink {
  purpose: TokenPurpose;
  personId: string | null;
  organisationId: string | null;
  guardianEmail: string | null;
}

/** One answer for every unknown, spent or expired link, so a link reveals nothing about others. */
const LINK_GONE =
  'This link has expired or has already been used. You can ask for a fresh one from the sign-in page, or from your school.';
export const FORGOT_ANSWER =
  'If that address has a Stavemark account, we have sent it a link to choose a new password. It may take a minute to arrive; please check your spam folder too.';

@Injectable()
export class InvitationsService {
  constructor(
    @Inject(ENV) private readonly env: Env,
    @InjectDataSource() private readonly db: DataSource,
    private readonly tokens: TokenService,
    private readonly mail: MailService,
  ) {}

  /**
   * Link rows without a token yet (minted when the e-mail is sent), in the caller's transaction.
   * Returns each new id with its person or guardian address to pair it with its e-mail.
   */
  createLinks(
    em: EntityManager,
    links: NewLink[],
  ): Promise<{ id: string; personId: string | null; guardianEmail: string | null }[]> {
    return bulkInsert(
      em,
      'account_tokens',
      [
        { name: 'purpose', type: 'text' },
        { name: 'person_id', type: 'uuid' },
        { name: 'organisation_id', type: 'uuid' },
        { name: 'guardian_email', type: 'text' },
      ],
      links.map((l) => [l.purpose, l.personId, l.organisationId, l.guardianEmail]),
      'id, person_id, guardian_email',
    ).then((rows) =>
      rows.map((r) => ({
        id: r.id!,
        personId: r.person_id ?? null,
        guardianEmail: r.guardian_email ?? null,
      })),
    );
  }

  async linkInfo(token: string): Promise<LinkInfo> {
    const link = await this.findLive(this.db.manager, token);
    const org = link.organisationId
      ? await this.db.manager.findOne(Organisation, { where: { id: link.organisationId } })
      : null;
    let displayName = '';
    if (link.personId)
      displayName = (await this.db.manager.findOneByOrFail(Person, { id: link.personId }))
        .displayName;
    else {
      const g = await this.db.manager.findOne(Guardian, {
        where: { organisationId: link.organisationId!, email: link.guardianEmail! },
      });
      displayName = g?.name ?? '';
    }
    return {
      purpose: link.purpose,
      displayName,
      organisationName: org?.name ?? null,
      expiresAt: link.expiresAt!.toISOString(),
    };
  }

  /** Accepting an invitation and resetting a password both set the password through a link. */
  async setPassword(
    input: SetPasswordInput,
    purpose: 'invitation' | 'password_reset',
  ): Promise<AccountMessage> {
    const personId = await this.db.transaction(async (em) => {
      const link = await this.findLive(em, input.token, true);
      if (link.purpose !== purpose || !link.personId) throw invalid(LINK_GONE);
      const at = now();
      await em.update(AccountToken, { id: link.id }, { usedAt: at });
      // Any other outstanding link of this person is now pointless.
      await em.update(
        AccountToken,
        {
          personId: link.personId,
          usedAt: IsNull(),
          revokedAt: IsNull(),
          purpose: In(['invitation', 'password_reset']),
        },
        { revokedAt: at },
      );
      await em.update(
        Person,
        { id: link.personId },
        { passwordHash: await hashPassword(input.password) },
      );
      if (link.organisationId) {
        await this.recordAs(em, link.personId, link.organisationId, {
          action: purpose === 'invitation' ? 'invitation.accepted' : 'password.reset',
          entity: 'person',
          entityId: link.personId,
        });
      }
      return link.personId;
    });
    // Every older session and token stops working (design.md §8).
    await this.tokens.revokeAllFor(personId);
    return {
      message:
        purpose === 'invitation'
          ? 'Your password is set. Welcome to Stavemark: you can sign in now.'
          : 'Your new password is set, and you have been signed out everywhere else. You can sign in now.',
    };
  }

  /** Always the same answer, whether or not the address has an account. */
  async forgotPassword(input: ForgotPasswordInput): Promise<AccountMessage> {
    const person = await this.db.manager
      .createQueryBuilder(Person, 'p')
      .where('p.email = :email', { email: input.email })
      .andWhere('EXISTS (SELECT 1 FROM memberships m WHERE m.person_id = p.id AND m.active)')
      .getOne();
    if (person) {
      await this.db.transaction(async (em) => {
        await em.update(
          AccountToken,
          { personId: person.id, purpose: 'password_reset', usedAt: IsNull(), revokedAt: IsNull() },
          { revokedAt: now() },
        );
        const [link] = await this.createLinks(em, [
          {
            purpose: 'password_reset',
            personId: person.id,
            organisationId: null,
            guardianEmail: null,
          },
        ]);
        await this.mail.enqueue(em, [
          {
            organisationId: null,
            kind: 'password_reset',
            toAddress: person.email,
            toName: person.displayName,
            data: { displayName: person.displayName },
            accountTokenId: link!.id,
          },
        ]);
      });
      this.mail.afterCommit();
    }
    return { message: FORGOT_ANSWER };
  }

  async consentRequest(token: string): Promise<ConsentRequest> {
    const link = await this.findLive(this.db.manager, token);
    if (link.purpose !== 'guardian_consent') throw invalid(LINK_GONE);
    const guardians = await this.guardiansOf(this.db.manager, link);
    if (guardians.length === 0) throw invalid(LINK_GONE);
    const org = await this.db.manager.findOneByOrFail(Organisation, { id: link.organisationId! });
    return {
      guardianName: guardians[0]!.name,
      organisationName: org.name,
      expiresAt: link.expiresAt!.toISOString(),
      children: guardians.map((g) => ({
        studentId: g.studentId,
        givenName: g.student!.givenName,
        consentResultsEmail: g.consentResultsEmail,
        consentRecordings: g.consentRecordings,
      })),
    };
  }

  async submitConsent(input: SubmitConsentInput): Promise<AccountMessage> {
    await this.db.transaction(async (em) => {
      const link = await this.findLive(em, input.token, true);
      if (link.purpose !== 'guardian_consent') throw invalid(LINK_GONE);
      const guardians = await this.guardiansOf(em, link);
      const byStudent = new Map(guardians.map((g) => [g.studentId, g]));
      const answered = new Set(input.answers.map((a) => a.studentId));
      if (
        answered.size !== input.answers.length ||
        input.answers.some((a) => !byStudent.has(a.studentId)) ||
        answered.size !== byStudent.size
      ) {
        throw invalid('Please answer both questions for each child listed.');
      }
      const at = now();
      for (const a of input.answers) {
        const g = byStudent.get(a.studentId)!;
        await em.update(
          Guardian,
          { id: g.id },
          {
            consentResultsEmail: a.consentResultsEmail,
            consentRecordings: a.consentRecordings,
            consentAnsweredAt: at,
          },
        );
        await this.recordAs(em, null, link.organisationId!, {
          action: 'guardian.consent',
          entity: 'guardian',
          entityId: g.id,
          before: {
            consentResultsEmail: g.consentResultsEmail,
            consentRecordings: g.consentRecordings,
          },
          after: {
            consentResultsEmail: a.consentResultsEmail,
            consentRecordings: a.consentRecordings,
          },
        });
      }
      await em.update(AccountToken, { id: link.id }, { usedAt: at });
    });
    return { message: 'Thank you. Your answers are saved, and the school can see them.' };
  }

  private async findLive(em: EntityManager, token: string, lock = false): Promise<AccountToken> {
    const link = await em.findOne(AccountToken, {
      where: {
        tokenHash: hashLinkToken(token),
        usedAt: IsNull(),
        revokedAt: IsNull(),
        expiresAt: MoreThan(now()),
      },
      ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
    });
    if (!link) throw invalid(LINK_GONE);
    return link;
  }

  private guardiansOf(em: EntityManager, link: AccountToken): Promise<Guardian[]> {
    return em.find(Guardian, {
      where: {
        organisationId: link.organisationId!,
        email: link.guardianEmail!,
        student: { active: true },
      },
      relations: { student: true },
      order: { student: { dateOfBirth: 'ASC' } },
    });
  }

  /**
   * Audit on a public route: there is no signed-in caller for AuditService to read, so the event
   * is written here with the link's organisation and the link's person (none for a guardian).
   */
  private async recordAs(
    em: EntityManager,
    personId: string | null,
    organisationId: string,
    change: { action: string; entity: string; entityId: string; before?: object; after?: object },
  ): Promise<void> {
    await em.save(
      em.create(AuditEvent, {
        organisationId,
        actorPersonId: personId,
        action: change.action,
        entity: change.entity,
        entityId: change.entityId,
        before: (change.before as Record<string, unknown> | undefined) ?? null,
        after: (change.after as Record<string, unknown> | undefined) ?? null,
      }),
    );
  }
}
