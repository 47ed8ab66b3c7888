import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectRepository } from '@nestjs/typeorm';
import { IsNull, Repository } from 'typeorm';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import type { Caller } from '../common/request-context.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Person } from '../users/entities/person.entity.js';
import { RefreshToken } from './entities/refresh-token.entity.js';
import { preparedQuery } from '../common/prepared-query.js';

export interface AccessPayload {
  sub: string;
  org: string;
  tv: number;
}

export interface IssuedTokens {
  accessToken: string;
  expiresIn: number;
  refreshToken: string;
  refreshExpiresAt: Date;
}

const sha256 = (s: string): string => createHash('sha256').update(s).digest('hex');

@Injectable()
export class TokenService {
  constructor(
    private readonly jwt: JwtService,
    @Inject(ENV) private readonly env: Env,
    @InjectRepository(RefreshToken) private readonly refreshTokens: Repository<RefreshToken>,
    @InjectRepository(Membership) private readonly memberships: Repository<Membership>,
    @InjectRepository(Person) private readonly people: Repository<Person>,
  ) {}

  /**
   * The caller for a verified access-token payload, or null when the token was revoked. Runs on
   * every request, so it is one joined statement (findOne with relations takes two). Not cached:
   * a deactivation, a role change or a bumped token version must take effect on the next request,
   * whichever API instance answers it.
   */
  async callerFor(payload: AccessPayload): Promise<Caller | null> {
    const [row] = await preparedQuery<{ id: string; roles: Caller['roles']; time_zone: string }>(
      this.memberships.manager.connection,
      'auth-caller',
      `SELECT m.id, m.roles, o.time_zone FROM memberships m
         JOIN people p ON p.id = m.person_id
         JOIN organisations o ON o.id = m.organisation_id
        WHERE m.person_id = $1 AND m.organisation_id = $2 AND m.active AND p.token_version = $3`,
      [payload.sub, payload.org, payload.tv],
    );
    if (!row) return null;
    return {
      personId: payload.sub,
      membershipId: row.id,
      organisationId: payload.org,
      roles: row.roles,
      timeZone: row.time_zone,
    };
  }

  async issue(person: Person, organisationId: string, familyId: string = randomUUID()): Promise<IssuedTokens> {
    const payload: AccessPayload = { sub: person.id, org: organisationId, tv: person.tokenVersion };
    const expiresIn = this.env.ACCESS_TOKEN_TTL_SECONDS;
    const accessToken = await this.jwt.signAsync(payload, { expiresIn, algorithm: 'HS256' });
    const refreshToken = randomBytes(32).toString('base64url');
    const refreshExpiresAt = new Date(Date.now() + this.env.REFRESH_TOKEN_TTL_HOURS * 3600_000);
    await this.refreshTokens.insert({
      familyId,
      personId: person.id,
      organisationId,
      tokenHash: sha256(refreshToken),
      tokenVersion: person.tokenVersion,
      expiresAt: refreshExpiresAt,
    });
    return { accessToken, expiresIn, refreshToken, refreshExpiresAt };
  }

  /**
   * Rotates a refresh token. A token presented a second time means it was copied: the whole
   * family is revoked and the caller must sign in again.
   */
  async rotate(raw: string): Promise<{ tokens: IssuedTokens; person: Person; organisationId: string } | null> {
    const now = new Date();
    const found = await this.refreshTokens.findOne({ where: { tokenHash: sha256(raw) } });
    if (!found || found.revokedAt) return null;
    if (found.usedAt) {
      await this.revokeFamily(found.familyId);
      return null;
    }
    if (found.expiresAt <= now) return null;
    // Claim the token atomically so two concurrent refreshes cannot both succeed.
    const claimed = await this.refreshTokens.update({ id: found.id, usedAt: IsNull() }, { usedAt: now });
    if (!claimed.affected) {
      await this.revokeFamily(found.familyId);
      return null;
    }
    const person = await this.people.findOne({ where: { id: found.personId } });
    if (!person || person.tokenVersion !== found.tokenVersion) return null;
    const membership = await this.memberships.findOne({
      where: { personId: person.id, organisationId: found.organisationId, active: true },
    });
    if (!membership) return null;
    const tokens = await this.issue(person, found.organisationId, found.familyId);
    return { tokens, person, organisationId: found.organisationId };
  }

  async revoke(raw: string): Promise<void> {
    const found = await this.refreshTokens.findOne({ where: { tokenHash: sha256(raw) } });
    if (found) await this.revokeFamily(found.familyId);
  }

  async revokeFamily(familyId: string): Promise<void> {
    await this.refreshTokens.update({ familyId, revokedAt: IsNull() }, { revokedAt: new Date() });
  }

  /** Revokes every token of a person: access tokens by version, refresh tokens by row. */
  async revokeAllFor(personId: string): Promise<void> {
    await this.people.increment({ id: personId }, 'tokenVersion', 1);
    await this.refreshTokens.update({ personId, revokedAt: IsNull() }, { revokedAt: new Date() });
  }
}
