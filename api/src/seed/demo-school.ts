import { readFileSync } from 'node:fs';
import type { EntityManager } from 'typeorm';
import type { Role } from '@stavemark/shared';
import { hashPassword } from '../auth/passwords.js';
import { seedStarterLibrary } from '../rubrics/starter-library.js';
import { seedDemoSittings } from '../sittings/demo-sittings.js';
import { seedDemoYear } from './demo-year.js';
import { seedDemoStandardisation } from './demo-standardisation.js';

export const DEMO_PASSWORD = 'stavemark-demo';

interface SeedPerson {
  email: string;
  displayName: string;
  roles: Role[];
}
interface SeedStudent {
  pupilNumber: string;
  givenName: string;
  familyName: string;
  birthday: string;
  ageOnSeedDay: number;
  grade: number;
  classes: string[];
  email?: string;
  guardian?: { name: string; email: string };
  signIn?: boolean;
}
interface SeedOrganisation {
  organisation: { name: string; slug: string; timeZone: string };
  people: SeedPerson[];
  classes: { code: string; name: string; grade: number | null; teachers: string[] }[];
  students: SeedStudent[];
}
export interface DemoSchool extends SeedOrganisation {
  otherOrganisations: SeedOrganisation[];
}

export function readDemoSchool(path: string): DemoSchool {
  return JSON.parse(readFileSync(path, 'utf8')) as DemoSchool;
}

/** Date of birth that makes the student `age` on `today` (YYYY-MM-DD), with the given MM-DD birthday. */
export function dateOfBirth(today: string, birthday: string, age: number): string {
  const year = Number(today.slice(0, 4));
  const hadBirthday = birthday <= today.slice(5);
  return `${year - age - (hadBirthday ? 0 : 1)}-${birthday}`;
}

/** The academic year (September to July) containing `today`, as three terms. */
export function termsFor(today: string): { name: string; academicYear: string; startsOn: string; endsOn: string }[] {
  const y = Number(today.slice(0, 4));
  const start = Number(today.slice(5, 7)) >= 8 ? y : y - 1;
  const ay = `${start}-${String((start + 1) % 100).padStart(2, '0')}`;
  return [
    { name: `Autumn ${start}`, academicYear: ay, startsOn: `${start}-09-01`, endsOn: `${start}-12-20` },
    { name: `Spring ${start + 1}`, academicYear: ay, startsOn: `${start + 1}-01-05`, endsOn: `${start + 1}-04-02` },
    { name: `Summer ${start + 1}`, academicYear: ay, startsOn: `${start + 1}-04-20`, endsOn: `${start + 1}-07-22` },
  ];
}

/** Seeds one organisation idempotently: running it twice leaves the same rows. */
export async function seedOrganisation(em: EntityManager, data: SeedOrganisation, today: string, passwordHash: string): Promise<string> {
  const [org] = (await em.query(
    `INSERT INTO organisations (name, slug, time_zone) VALUES ($1, $2, $3)
     ON CONFLICT (slug) DO UPDATE SET name = EXCLUDED.name, time_zone = EXCLUDED.time_zone RETURNING id`,
    [data.organisation.name, data.organisation.slug, data.organisation.timeZone],
  )) as { id: string }[];
  const orgId = org!.id;

  for (const t of termsFor(today)) {
    await em.query(
      `INSERT INTO terms (organisation_id, name, academic_year, starts_on, ends_on) VALUES ($1, $2, $3, $4, $5)
       ON CONFLICT (organisation_id, name) DO UPDATE SET starts_on = EXCLUDED.starts_on, ends_on = EXCLUDED.ends_on`,
      [orgId, t.name, t.academicYear, t.startsOn, t.endsOn],
    );
  }
  const [term] = (await em.query(
    `SELECT id FROM terms WHERE organisation_id = $1 AND starts_on <= $2 ORDER BY starts_on DESC LIMIT 1`,
    [orgId, today],
  )) as { id: string }[];

  const membershipOf = new Map<string, string>();
  const addMember = async (email: string, displayName: string, roles: Role[]): Promise<string> => {
    const [p] = (await em.query(
      `INSERT INTO people (email, display_name, password_hash) VALUES ($1, $2, $3)
       ON CONFLICT (email) DO UPDATE SET display_name = EXCLUDED.display_name,
         password_hash = COALESCE(people.password_hash, EXCLUDED.password_hash)
       RETURNING id`,
      [email, displayName, passwordHash],
    )) as { id: string }[];
    const [m] = (await em.query(
      `INSERT INTO memberships (organisation_id, person_id, roles) VALUES ($1, $2, $3)
       ON CONFLICT (organisation_id, person_id) DO UPDATE SET roles = EXCLUDED.roles, active = true RETURNING id`,
      [orgId, p!.id, roles],
    )) as { id: string }[];
    membershipOf.set(email, m!.id);
    return m!.id;
  };
  for (const p of data.people) await addMember(p.email, p.displayName, p.roles);

  const classId = new Map<string, string>();
  for (const c of data.classes) {
    const [row] = (await em.query(
      `INSERT INTO classes (organisation_id, term_id, name, code, grade) VALUES ($1, $2, $3, $4, $5)
       ON CONFLICT (organisation_id, code) DO UPDATE SET name = EXCLUDED.name, grade = EXCLUDED.grade RETURNING id`,
      [orgId, term?.id ?? null, c.name, c.code, c.grade],
    )) as { id: string }[];
    classId.set(c.code, row!.id);
    for (const t of c.teachers) {
      const mid = membershipOf.get(t);
      if (!mid) throw new Error(`Seed: class ${c.code} names teacher ${t}, who is not in the organisation`);
      await em.query(`INSERT INTO class_teachers (class_id, membership_id) VALUES ($1, $2) ON CONFLICT DO NOTHING`, [row!.id, mid]);
    }
  }

  for (const s of data.students) {
    const displayName = `${s.givenName} ${s.familyName}`;
    const membershipId = s.signIn && s.email ? await addMember(s.email, displayName, ['student']) : null;
    const [row] = (await em.query(
      `INSERT INTO students (organisation_id, membership_id, pupil_number, given_name, family_name, email, date_of_birth, grade)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8)
       ON CONFLICT (organisation_id, pupil_number) DO UPDATE SET membership_id = EXCLUDED.membership_id,
         given_name = EXCLUDED.given_name, family_name = EXCLUDED.family_name, email = EXCLUDED.email,
         date_of_birth = EXCLUDED.date_of_birth, grade = EXCLUDED.grade
       RETURNING id`,
      [orgId, membershipId, s.pupilNumber, s.givenName, s.familyName, s.email ?? null, dateOfBirth(today, s.birthday, s.ageOnSeedDay), s.grade],
    )) as { id: string }[];
    for (const code of s.classes) {
      const cid = classId.get(code);
      if (!cid) throw new Error(`Seed: student ${s.pupilNumber} names unknown class ${code}`);
      await em.query(`INSERT INTO class_members (class_id, student_id) VALUES ($1, $2) ON CONFLICT DO NOTHING`, [cid, row!.id]);
    }
    if (s.guardian) {
      await em.query(
        `INSERT INTO guardians (organisation_id, student_id, name, email, consent_results_email, consent_recordings, consent_answered_at)
         VALUES ($1, $2, $3, $4, true, $5, now())
         ON CONFLICT (student_id, email) DO UPDATE SET name = EXCLUDED.name`,
        [orgId, row!.id, s.guardian.name, s.guardian.email, s.ageOnSeedDay >= 10],
      );
    }
  }
  return orgId;
}

export async function seedDemo(em: EntityManager, data: DemoSchool, today: string): Promise<{ organisationId: string }> {
  const hash = await hashPassword(DEMO_PASSWORD);
  const organisationId = await seedOrganisation(em, data, today, hash);
  for (const other of data.otherOrganisations) await seedOrganisation(em, other, today, hash);
  await seedStarterLibrary(em, organisationId);
  await seedDemoSittings(em, organisationId, today);
  await seedDemoYear(em, organisationId, today);
  await seedDemoStandardisation(em, organisationId, today);
  return { organisationId };
}
