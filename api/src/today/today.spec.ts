import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

// The demo is seeded for 2026-12-01 and the clock is fixed to that morning in London.
const SEED_DAY = '2026-12-01';

describe('GET /api/today', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ today: SEED_DAY, env: { STAVEMARK_NOW: `${SEED_DAY}T08:00:00Z` } });
  });
  afterAll(() => t.close());

  const today = async (email: string) =>
    (await t.http().get('/api/today').set('Authorization', `Bearer ${await signIn(t, email)}`)).body;

  it('gives the date in the organisation’s zone and only the caller’s sections', async () => {
    const v = await today('teacher@demo.example');
    expect(v).toMatchObject({ date: SEED_DAY, timeZone: 'Europe/London', organisationName: 'Kestrel Lane Music School' });
    expect(v.teacher.classes.map((c: { code: string }) => c.code).sort()).toEqual(['MON-FND', 'THU-SNR', 'WED-INT']);
    expect(v.admin).toBeUndefined();
    expect(v.examiner).toBeUndefined();
  });

  it('shows the demo examiner today’s sitting with the slots they mark', async () => {
    const v = await today('examiner@demo.example');
    expect(v.examiner.sittings.length).toBeGreaterThan(0);
    for (const s of v.examiner.sittings) {
      expect(s.mySlots).toBeGreaterThan(0);
      // Starts on the seed day in London.
      expect(new Intl.DateTimeFormat('en-CA', { timeZone: 'Europe/London' }).format(new Date(s.startsAt))).toBe(SEED_DAY);
    }
  });

  it('gives an admin the organisation’s figures', async () => {
    const v = await today('admin@demo.example');
    expect(v.admin).toMatchObject({ students: 46, classes: 4 });
    expect(v.admin.term.name).toBe('Autumn 2026');
  });

  it('gives the demo student their classes and teachers, nothing else', async () => {
    const v = await today('student@demo.example');
    expect(v.student.name).toBe('Ellis Northcott');
    expect(v.student.classes[0].teachers).toEqual(expect.arrayContaining(['Idris Calloway']));
    expect(v.teacher).toBeUndefined();
  });
});
