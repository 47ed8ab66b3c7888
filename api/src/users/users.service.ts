import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type { CreateUserInput, ListUsersQuery, Page, UpdateUserInput, UserRow } from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { TokenService } from '../auth/token.service.js';
import { hashPassword } from '../auth/passwords.js';
import { conflict } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { InvitationsService } from '../invitations/invitations.service.js';
import { MailService } from '../mail/mail.service.js';
import { Organisation } from '../organisations/entities/organisation.entity.js';
import { Membership } from './entities/membership.entity.js';
import { Person } from './entities/person.entity.js';
import { toUserRow } from './users.mapper.js';

const SORT_COLUMN = { displayName: 'p.displayName', email: 'p.email', createdAt: 'm.createdAt' } as const;

@Injectable()
export class UsersService {
  private readonly memberships: ScopedRepository<Membership>;

  constructor(
    @InjectRepository(Membership) membershipRepo: Repository<Membership>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly tokens: TokenService,
    private readonly invitations: InvitationsService,
    private readonly mail: MailService,
  ) {
    this.memberships = new ScopedRepository(membershipRepo, 'person');
  }

  async list(q: ListUsersQuery): Promise<Page<UserRow>> {
    const qb = this.memberships.qb('m').innerJoinAndSelect('m.person', 'p');
    if (q.search) {
      qb.andWhere('(p.displayName ILIKE :s OR p.email ILIKE :s)', { s: `%${escapeLike(q.search)}%` });
    }
    if (q.role) qb.andWhere(':role = ANY(m.roles)', { role: q.role });
    if (q.active !== undefined) qb.andWhere('m.active = :active', { active: q.active });
    qb.orderBy(SORT_COLUMN[q.sort], q.order === 'asc' ? 'ASC' : 'DESC')
      .addOrderBy('p.id', 'ASC')
      .skip((q.page - 1) * q.pageSize)
      .take(q.pageSize);
    const [rows, total] = await qb.getManyAndCount();
    return { items: rows.map(toUserRow), total, page: q.page, pageSize: q.pageSize };
  }

  async create(input: CreateUserInput): Promise<UserRow> {
    const row = await this.db.transaction(async (em) => {
      const memberships = this.memberships.withManager(em);
      let person = await em.findOne(Person, { where: { email: input.email } });
      const isNew = !person;
      if (person) {
        const existing = await memberships.findOne({ where: { personId: person.id } });
        if (existing) throw conflict('This e-mail address already belongs to someone in your organisation.', [
          { path: 'email', message: 'already a member' },
        ]);
      } else {
        person = await em.save(
          em.create(Person, {
            email: input.email,
            displayName: input.displayName,
            passwordHash: input.password ? await hashPassword(input.password) : null,
          }),
        );
      }
      const m = await memberships.save(memberships.create({ personId: person.id, roles: input.roles, active: true }));
      await this.audit.record(
        { action: 'member.created', entity: 'membership', entityId: m.id, after: { email: input.email, roles: input.roles } },
        em,
      );
      // Without a password the person is invited by e-mail to choose one (a one-time link),
      // written in this transaction and sent after commit.
      if (isNew && !input.password) {
        const org = await em.findOneByOrFail(Organisation, { id: m.organisationId });
        const [link] = await this.invitations.createLinks(em, [
          { purpose: 'invitation', personId: person.id, organisationId: m.organisationId, guardianEmail: null },
        ]);
        await this.mail.enqueue(em, [
          {
            organisationId: m.organisationId,
            kind: 'invitation',
            toAddress: person.email,
            toName: person.displayName,
            data: { organisationName: org.name, displayName: person.displayName },
            accountTokenId: link!.id,
          },
        ]);
      }
      m.person = person;
      return toUserRow(m);
    });
    this.mail.afterCommit();
    return row;
  }

  async update(personId: string, input: UpdateUserInput): Promise<UserRow> {
    const caller = RequestContext.requireCaller();
    const revoke = await this.db.transaction(async (em) => {
      const memberships = this.memberships.withManager(em);
      const m = await memberships.getOne({ where: { personId }, relations: { person: true } });
      const person = m.person!;
      const before = { displayName: person.displayName, roles: m.roles, active: m.active, noteNames: person.noteNames };
      if (personId === caller.personId) {
        if (input.active === false) throw conflict('You cannot deactivate your own account.');
        if (input.roles && !input.roles.includes('admin')) throw conflict('You cannot remove your own admin role.');
      }
      if (input.displayName !== undefined) person.displayName = input.displayName;
      if (input.noteNames !== undefined) person.noteNames = input.noteNames;
      if (input.roles !== undefined) m.roles = input.roles;
      const deactivating = input.active === false && m.active;
      if (input.active !== undefined) m.active = input.active;
      await em.save(person);
      await memberships.save(m);
      await this.audit.record(
        {
          action: 'member.updated',
          entity: 'membership',
          entityId: m.id,
          before,
          after: { displayName: person.displayName, roles: m.roles, active: m.active, noteNames: person.noteNames },
        },
        em,
      );
      return deactivating;
    });
    // Deactivation ends every session at once (design.md §8).
    if (revoke) await this.tokens.revokeAllFor(personId);
    const m = await this.memberships.getOne({ where: { personId }, relations: { person: true } });
    return toUserRow(m);
  }
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}
