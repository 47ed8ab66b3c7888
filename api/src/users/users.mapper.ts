import type { UserRow } from '@stavemark/shared';
import type { Membership } from './entities/membership.entity.js';

/** What leaves the server about a member: never the entity itself (no password hash can leak). */
export function toUserRow(m: Membership): UserRow {
  if (!m.person) throw new Error('membership loaded without its person');
  return {
    id: m.person.id,
    email: m.person.email,
    displayName: m.person.displayName,
    roles: m.roles,
    active: m.active,
    createdAt: m.createdAt.toISOString(),
  };
}
