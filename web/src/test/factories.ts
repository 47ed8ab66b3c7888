import type { AuthSession, CurrentUser, Role, UserRow } from '@stavemark/shared';

export const ORG_ID = '6c0f2a0e-4b7e-4a53-9a43-1a2b3c4d5e01';
export const OTHER_ORG_ID = '6c0f2a0e-4b7e-4a53-9a43-1a2b3c4d5e02';

export function makeUser(roles: Role[], overrides: Partial<CurrentUser> = {}): CurrentUser {
  return {
    id: '0b9a7f00-0000-4000-8000-000000000001',
    email: 'rowan.hale@school.example',
    displayName: 'Rowan Hale',
    noteNames: 'british',
    memberships: [
      {
        organisationId: ORG_ID,
        organisationName: 'Larkfield Music School',
        timeZone: 'Europe/London',
        roles,
      },
    ],
    activeOrganisationId: ORG_ID,
    ...overrides,
  };
}

export function makeSession(user: CurrentUser, accessToken = 'token-1'): AuthSession {
  return { accessToken, expiresIn: 900, user };
}

let n = 0;
export function makeUserRow(overrides: Partial<UserRow> = {}): UserRow {
  n += 1;
  return {
    id: `0b9a7f00-0000-4000-8000-${String(1000 + n).padStart(12, '0')}`,
    email: `person${n}@school.example`,
    displayName: `Person ${n}`,
    roles: ['student'],
    active: true,
    createdAt: '2026-09-01T08:30:00.000Z',
    ...overrides,
  };
}
