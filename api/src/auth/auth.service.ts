import { Inject, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { AuthSession, CurrentUser, LoginInput, NoteNameConvention } from '@stavemark/shared';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { DomainError, ErrorCode, notFound, unauthenticated } from '../common/errors.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Person } from '../users/entities/person.entity.js';
import { verifyPassword } from './passwords.js';
import { TokenService, type IssuedTokens } from './token.service.js';

export interface SessionWithRefresh {
  session: AuthSession;
  refreshToken: string;
  refreshExpiresAt: Date;
}

const WRONG = 'The e-mail address or password is not right.';

@Injectable()
export class AuthService {
  constructor(
    @Inject(ENV) private readonly env: Env,
    private readonly tokens: TokenService,
    @InjectRepository(Person) private readonly people: Repository<Person>,
    @InjectRepository(Membership) private readonly memberships: Repository<Membership>,
  ) {}

  async login(input: LoginInput): Promise<SessionWithRefresh> {
    if (this.env.NODE_ENV === 'production' && input.email.endsWith('@demo.example')) {
      throw unauthenticated('Demo sign-ins are not available on this server.');
    }
    const person = await this.people
      .createQueryBuilder('p')
      .addSelect('p.passwordHash')
      .where('p.email = :email', { email: input.email })
      .getOne();
    const ok = await verifyPassword(input.password, person?.passwordHash);
    if (!person || !ok) throw unauthenticated(WRONG);

    const active = await this.activeMemberships(person.id);
    if (active.length === 0) {
      throw unauthenticated('This account is not active. Please ask your school’s administrator.');
    }
    const chosen = input.organisationId
      ? active.find((m) => m.organisationId === input.organisationId)
      : active[0];
    if (!chosen) throw unauthenticated('You are not a member of that organisation.');

    await this.people.update({ id: person.id }, { lastSignInAt: new Date() });
    return this.sessionFor(person, chosen.organisationId, await this.tokens.issue(person, chosen.organisationId));
  }

  async refresh(raw: string | undefined): Promise<SessionWithRefresh> {
    const rotated = raw ? await this.tokens.rotate(raw) : null;
    if (!rotated) throw unauthenticated('Your session has ended; please sign in again.');
    return this.sessionFor(rotated.person, rotated.organisationId, rotated.tokens);
  }

  async logout(raw: string | undefined): Promise<void> {
    if (raw) await this.tokens.revoke(raw);
  }

  async switchOrganisation(personId: string, organisationId: string): Promise<SessionWithRefresh> {
    const person = await this.people.findOneByOrFail({ id: personId });
    const m = await this.memberships.findOne({ where: { personId, organisationId, active: true } });
    if (!m) throw notFound('organisation');
    return this.sessionFor(person, organisationId, await this.tokens.issue(person, organisationId));
  }

  async me(personId: string, organisationId: string): Promise<CurrentUser> {
    const person = await this.people.findOneByOrFail({ id: personId });
    return this.currentUser(person, organisationId);
  }

  async updateMe(
    personId: string,
    organisationId: string,
    changes: { displayName?: string; noteNames?: NoteNameConvention },
  ): Promise<CurrentUser> {
    if (Object.keys(changes).length === 0) throw new DomainError(ErrorCode.Invalid, 'Nothing to change.');
    await this.people.update({ id: personId }, changes);
    return this.me(personId, organisationId);
  }

  private activeMemberships(personId: string): Promise<Membership[]> {
    return this.memberships.find({
      where: { personId, active: true },
      relations: { organisation: true },
      order: { createdAt: 'ASC' },
    });
  }

  private async currentUser(person: Person, activeOrganisationId: string): Promise<CurrentUser> {
    const ms = await this.activeMemberships(person.id);
    return {
      id: person.id,
      email: person.email,
      displayName: person.displayName,
      noteNames: person.noteNames,
      activeOrganisationId,
      memberships: ms.map((m) => ({
        organisationId: m.organisationId,
        organisationName: m.organisation?.name ?? '',
        timeZone: m.organisation?.timeZone ?? 'UTC',
        roles: m.roles,
      })),
    };
  }

  private async sessionFor(person: Person, organisationId: string, t: IssuedTokens): Promise<SessionWithRefresh> {
    return {
      session: { accessToken: t.accessToken, expiresIn: t.expiresIn, user: await this.currentUser(person, organisationId) },
      refreshToken: t.refreshToken,
      refreshExpiresAt: t.refreshExpiresAt,
    };
  }
}
