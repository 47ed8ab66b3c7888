import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, QueryFailedError, Repository, type EntityManager } from 'typeorm';
import type { ImportReport, ImportRowReport, ImportRowStatus } from '@stavemark/shared';
import { AuditService } from '../../audit/audit.service.js';
import { localDate, now } from '../../common/clock.js';
import { conflict, invalid } from '../../common/errors.js';
import { RequestContext, type Caller } from '../../common/request-context.js';
import { ScopedRepository } from '../../common/scoped-repository.js';
import { InvitationsService } from '../../invitations/invitations.service.js';
import { MailService, type NewMail } from '../../mail/mail.service.js';
import { Organisation } from '../../organisations/entities/organisation.entity.js';
import { Guardian } from '../../students/entities/guardian.entity.js';
import { Student } from '../../students/entities/student.entity.js';
import { bulkInsert } from '../../common/bulk-sql.js';
import { ClassGroup } from '../entities/class-group.entity.js';
import { CsvFileError, parseClassListFile, type CsvRecord } from './class-list-csv.js';
import { ImportProgressBoard, type ImportProgress } from './import-progress.js';
import { checkRecord, type CheckedRow, type RowCheck } from './row-checks.js';

/** Reports how far an import has come (a no-op when the client asked for no progress). */
type Report = (p: ImportProgress) => void;
/** The writing steps of an apply, in order, for its progress. */
const WRITE_STEPS = [
  'Creating new classes',
  'Creating sign-ins for new students',
  'Preparing the rows',
  'Writing students',
  'Writing guardians and class places',
  'Queueing invitations and notices',
  'Saving the import',
] as const;

/** A student row as the analysis needs it. */
interface KnownStudent {
  id: string;
  pupilNumber: string;
  givenName: string;
  familyName: string;
  email: string | null;
  dateOfBirth: string;
  grade: number | null;
  membershipId: string | null;
  guardians: { id: string; name: string; email: string }[];
  classIds: Set<string>;
}

/** New students are keyed by pupil number until they have an id. */
type StudentKey = { id: string } | { pupilNumber: string };

interface Plan {
  report: Omit<ImportReport, 'dryRun' | 'applied' | 'fileName'>;
  newClassCodes: string[];
  /** Ids of the classes the rows name, by code (new ones added when created). */
  classIds: Map<string, string>;
  newStudents: CheckedRow[];
  updates: { student: KnownStudent; row: CheckedRow }[];
  newGuardians: { key: StudentKey; name: string; email: string }[];
  guardianRenames: { id: string; name: string }[];
  classJoins: { key: StudentKey; classCode: string }[];
  /** Sign-ins for new students with an e-mail. */
  signIns: {
    pupilNumber: string;
    email: string;
    displayName: string;
    personId: string | null;
    membershipId: string | null;
    addRole: boolean;
    invite: boolean;
  }[];
  notices: { email: string; name: string; children: string[] }[];
}

@Injectable()
export class ClassImportService {
  private readonly students: ScopedRepository<Student>;
  private readonly classes: ScopedRepository<ClassGroup>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Student) studentRepo: Repository<Student>,
    @InjectRepository(ClassGroup) classRepo: Repository<ClassGroup>,
    private readonly audit: AuditService,
    private readonly invitations: InvitationsService,
    private readonly mail: MailService,
    private readonly progress: ImportProgressBoard,
  ) {
    this.students = new ScopedRepository(studentRepo, 'student');
    this.classes = new ScopedRepository(classRepo, 'class');
  }

  /**
   * Dry run: the report of what would happen. Apply: the same analysis inside one transaction,
   * written only when no row has an error (all or nothing, design.md §7); the e-mails it causes
   * are rows in that transaction and go out after commit.
   */
  async import(
    file: { path: string; size: number; originalname: string },
    dryRun: boolean,
    progressId: string | null = null,
  ): Promise<ImportReport> {
    const caller = RequestContext.requireCaller();
    const tell: Report = progressId
      ? (p) => this.progress.set(caller.membershipId, progressId, p)
      : () => {};
    tell({ phase: 'reading', done: 0, total: 0, step: 'Reading the file' });
    let parsed;
    try {
      parsed = await parseClassListFile(file.path, file.size);
    } catch (err) {
      if (err instanceof CsvFileError)
        throw invalid(err.message, [{ path: 'file', message: err.message }]);
      throw err;
    }
    const fileName = file.originalname || 'class-list.csv';
    if (dryRun) {
      const plan = await this.analyse(
        this.db.manager,
        caller,
        parsed.records,
        parsed.delimiter,
        tell,
      );
      tell({ phase: 'done', done: 1, total: 1, step: 'Checked' });
      return { ...plan.report, dryRun: true, applied: false, fileName };
    }
    try {
      const report = await this.db.transaction(async (em) => {
        // One import per organisation at a time, so the analysis stays true until commit.
        await em.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [
          `class-import:${caller.organisationId}`,
        ]);
        const plan = await this.analyse(em, caller, parsed.records, parsed.delimiter, tell);
        const full: ImportReport = { ...plan.report, dryRun: false, applied: false, fileName };
        if (plan.report.counts.error > 0) {
          const n = plan.report.counts.error;
          throw invalid(
            `${n} row${n === 1 ? ' has an error' : 's have errors'}, so nothing was imported. Correct the file and upload it again.`,
            {
              report: full,
            },
          );
        }
        await this.apply(em, caller, plan, fileName, tell);
        return { ...full, applied: true };
      });
      tell({
        phase: 'done',
        done: WRITE_STEPS.length,
        total: WRITE_STEPS.length,
        step: 'Imported',
      });
      this.mail.afterCommit();
      return report;
    } catch (err) {
      if (
        err instanceof QueryFailedError &&
        (err as QueryFailedError & { code?: string }).code === '23505'
      ) {
        throw conflict(
          'These students were changed by someone else at the same moment. Nothing was imported; please run the import again.',
        );
      }
      throw err;
    }
  }

  private async analyse(
    em: EntityManager,
    caller: Caller,
    records: CsvRecord[],
    delimiter: ',' | ';',
    report: Report,
  ): Promise<Plan> {
    const org = await em.findOneByOrFail(Organisation, { id: caller.organisationId });
    const importDate = localDate(now(), org.timeZone);
    const isAdmin = caller.roles.includes('admin');
    const checks: RowCheck[] = [];
    for (let i = 0; i < records.length; i++) {
      // Every 250 rows, let the event loop answer other requests (the progress poll among them).
      if (i % 250 === 0) {
        report({ phase: 'checking', done: i, total: records.length, step: 'Checking every row' });
        await new Promise((r) => setImmediate(r));
      }
      checks.push(checkRecord(records[i]!, importDate));
    }
    report({
      phase: 'checking',
      done: records.length,
      total: records.length,
      step: 'Matching rows with the students already here',
    });

    // The same pupil number or student e-mail twice in one file.
    const firstLine = (key: (i: number) => string | null) => {
      const lines = new Map<string, number[]>();
      checks.forEach((_, i) => {
        const k = key(i);
        if (k) lines.set(k, [...(lines.get(k) ?? []), records[i]!.line]);
      });
      return lines;
    };
    const pupilLines = firstLine((i) => checks[i]!.display.pupilNumber || null);
    const emailLines = firstLine(
      (i) => (records[i]!.cells.studentEmail ?? '').trim().toLowerCase() || null,
    );
    checks.forEach((c, i) => {
      const line = records[i]!.line;
      const others = (m: Map<string, number[]>, k: string) =>
        (m.get(k) ?? []).filter((l) => l !== line);
      const pn = c.display.pupilNumber;
      if (pn && others(pupilLines, pn).length)
        c.errors.push(
          `Pupil number ${pn} is in the file more than once (also line ${others(pupilLines, pn).join(', ')}).`,
        );
      const em_ = (records[i]!.cells.studentEmail ?? '').trim().toLowerCase();
      if (em_ && others(emailLines, em_).length)
        c.errors.push(
          `Student e-mail ${em_} is in the file more than once (also line ${others(emailLines, em_).join(', ')}).`,
        );
      if (c.errors.length) c.row = null;
    });

    const rows = checks.map((c) => c.row).filter((r): r is CheckedRow => r !== null);
    const scoped = {
      students: this.students.withManager(em),
      classes: this.classes.withManager(em),
    };

    // Everything the rows refer to, in a handful of queries.
    const pupilNumbers = rows.map((r) => r.pupilNumber).filter((p): p is string => !!p);
    const studentEmails = rows.map((r) => r.studentEmail).filter((e): e is string => !!e);
    const found =
      pupilNumbers.length || studentEmails.length
        ? await scoped.students
            .qb('s')
            // IN (SELECT unnest(…)) is a hashed lookup; `= ANY(array)` scans the array per row.
            .andWhere(
              '(s.pupilNumber IN (SELECT unnest(CAST(:pns AS text[]))) OR s.email IN (SELECT unnest(CAST(:emails AS text[]))))',
              {
                pns: pupilNumbers,
                emails: studentEmails,
              },
            )
            .getMany()
        : [];
    const known = new Map<string, KnownStudent>();
    for (const s of found) {
      known.set(s.id, {
        id: s.id,
        pupilNumber: s.pupilNumber,
        givenName: s.givenName,
        familyName: s.familyName,
        email: s.email,
        dateOfBirth: s.dateOfBirth,
        grade: s.grade,
        membershipId: s.membershipId,
        guardians: [],
        classIds: new Set(),
      });
    }
    if (known.size) {
      const ids = [...known.keys()];
      const guardians = await em
        .getRepository(Guardian)
        .createQueryBuilder('g')
        .where('g.organisationId = :org AND g.studentId = ANY(:ids)', {
          org: caller.organisationId,
          ids,
        })
        .getMany();
      for (const g of guardians)
        known.get(g.studentId)!.guardians.push({ id: g.id, name: g.name, email: g.email });
      const memberships = (await em.query(
        `SELECT class_id, student_id FROM class_members WHERE student_id = ANY($1)`,
        [ids],
      )) as {
        class_id: string;
        student_id: string;
      }[];
      for (const m of memberships) known.get(m.student_id)!.classIds.add(m.class_id);
    }
    const byPupil = new Map([...known.values()].map((s) => [s.pupilNumber, s]));
    const byEmail = new Map<string, KnownStudent>();
    for (const s of known.values()) if (s.email) byEmail.set(s.email, s);

    const codes = [...new Set(rows.map((r) => r.classCode))];
    const classRows = codes.length
      ? await scoped.classes.qb('c').andWhere('c.code = ANY(:codes)', { codes }).getMany()
      : [];
    const classByCode = new Map(classRows.map((c) => [c.code, c]));
    const mine = new Set(
      isAdmin
        ? []
        : (
            (await em.query(`SELECT class_id FROM class_teachers WHERE membership_id = $1`, [
              caller.membershipId,
            ])) as { class_id: string }[]
          ).map((r) => r.class_id),
    );

    const plan: Plan = {
      report: {
        delimiter,
        rowCount: records.length,
        counts: { new: 0, updated: 0, unchanged: 0, error: 0 },
        rows: [],
        newClassCodes: [],
        invitations: 0,
        guardianNotices: 0,
        importDate,
      },
      newClassCodes: [],
      classIds: new Map(classRows.map((c) => [c.code, c.id])),
      newStudents: [],
      updates: [],
      newGuardians: [],
      guardianRenames: [],
      classJoins: [],
      signIns: [],
      notices: [],
    };
    const newCodes = new Set<string>();
    const notices = new Map<string, { email: string; name: string; children: string[] }>();
    const pendingSignIns: { row: CheckedRow; displayName: string }[] = [];

    checks.forEach((check, i) => {
      const line = records[i]!.line;
      const report: ImportRowReport = {
        line,
        status: 'error',
        ...check.display,
        changes: [],
        errors: check.errors,
      };
      plan.report.rows.push(report);
      const row = check.row;
      if (!row) {
        plan.report.counts.error++;
        return;
      }
      const errors: string[] = [];
      const changes: string[] = [];

      // The class: one of the caller's, or a new code (created on apply).
      const cls = classByCode.get(row.classCode);
      if (cls && !isAdmin && !mine.has(cls.id)) {
        errors.push(
          `Class ${row.classCode} is taught by other teachers, so you cannot import into it. Check the code, or ask an administrator.`,
        );
      }
      if (!cls) newCodes.add(row.classCode);

      // Match by pupil number when given, else by student e-mail.
      const existing = row.pupilNumber
        ? byPupil.get(row.pupilNumber)
        : row.studentEmail
          ? byEmail.get(row.studentEmail)
          : undefined;
      if (!existing && !row.pupilNumber)
        errors.push(
          `No student here has the e-mail ${row.studentEmail}; a new student needs a pupil number.`,
        );
      if (row.studentEmail) {
        const holder = byEmail.get(row.studentEmail);
        if (holder && holder !== existing)
          errors.push(
            `Student e-mail ${row.studentEmail} already belongs to pupil ${holder.pupilNumber}.`,
          );
      }
      if (existing && !isAdmin && ![...existing.classIds].some((id) => mine.has(id))) {
        errors.push(
          `Pupil number ${existing.pupilNumber} belongs to a student who is not in your classes. Check the number, or ask an administrator.`,
        );
      }
      if (errors.length) {
        report.errors = errors;
        plan.report.counts.error++;
        return;
      }

      const name = `${row.givenName} ${row.familyName}`;
      if (existing) {
        const diff = (label: string, from: string | number | null, to: string | number | null) => {
          if (to !== null && from !== to) changes.push(`${label}: ${from ?? '(none)'} → ${to}`);
        };
        diff('Given name', existing.givenName, row.givenName);
        diff('Family name', existing.familyName, row.familyName);
        diff('Student e-mail', existing.email, row.studentEmail);
        diff('Date of birth', existing.dateOfBirth, row.dateOfBirth);
        diff('Grade', existing.grade, row.grade);
        if (row.pupilNumber === null) report.pupilNumber = existing.pupilNumber;
        if (changes.length) plan.updates.push({ student: existing, row });
        if (row.guardianEmail) {
          const g = existing.guardians.find((x) => x.email === row.guardianEmail);
          if (!g) {
            changes.push(`New guardian: ${row.guardianName} <${row.guardianEmail}>`);
            plan.newGuardians.push({
              key: { id: existing.id },
              name: row.guardianName!,
              email: row.guardianEmail,
            });
            if (row.minor) this.addNotice(notices, row, existing.givenName);
          } else if (g.name !== row.guardianName) {
            changes.push(`Guardian name: ${g.name} → ${row.guardianName}`);
            plan.guardianRenames.push({ id: g.id, name: row.guardianName! });
          }
        }
        if (!cls || !existing.classIds.has(cls.id)) {
          changes.push(`Joins class ${row.classCode}`);
          plan.classJoins.push({ key: { id: existing.id }, classCode: row.classCode });
        }
        report.status = changes.length ? 'updated' : 'unchanged';
        report.changes = changes;
      } else {
        report.status = 'new';
        plan.newStudents.push(row);
        plan.classJoins.push({ key: { pupilNumber: row.pupilNumber! }, classCode: row.classCode });
        if (row.guardianEmail) {
          plan.newGuardians.push({
            key: { pupilNumber: row.pupilNumber! },
            name: row.guardianName!,
            email: row.guardianEmail,
          });
          if (row.minor) this.addNotice(notices, row, row.givenName);
        }
        if (row.studentEmail) pendingSignIns.push({ row, displayName: name });
      }
      plan.report.counts[report.status as ImportRowStatus]++;
    });

    // Sign-ins for new students with their own e-mail: a new person is invited; a person who
    // already has a sign-in elsewhere is linked, and invited only if they never set a password.
    if (pendingSignIns.length) {
      const emails = pendingSignIns.map((p) => p.row.studentEmail!);
      const people = (await em.query(
        `SELECT p.id, p.email, p.password_hash IS NOT NULL AS has_password, m.id AS membership_id, m.roles,
                EXISTS (SELECT 1 FROM students s WHERE s.membership_id = m.id) AS linked
           FROM people p LEFT JOIN memberships m ON m.person_id = p.id AND m.organisation_id = $2
          WHERE p.email = ANY($1)`,
        [emails, caller.organisationId],
      )) as {
        id: string;
        email: string;
        has_password: boolean;
        membership_id: string | null;
        roles: string[] | null;
        linked: boolean;
      }[];
      const personByEmail = new Map(people.map((p) => [p.email, p]));
      for (const { row, displayName } of pendingSignIns) {
        const p = personByEmail.get(row.studentEmail!);
        if (p?.linked) {
          const report = plan.report.rows.find((r) => r.line === row.line)!;
          report.status = 'error';
          report.errors = [
            `Student e-mail ${row.studentEmail} is already the sign-in of another student here.`,
          ];
          plan.report.counts.new--;
          plan.report.counts.error++;
          continue;
        }
        plan.signIns.push({
          pupilNumber: row.pupilNumber!,
          email: row.studentEmail!,
          displayName,
          personId: p?.id ?? null,
          membershipId: p?.membership_id ?? null,
          addRole: !!p?.membership_id && !(p.roles ?? []).includes('student'),
          invite: !p || !p.has_password,
        });
      }
    }

    plan.newClassCodes = [...newCodes].sort();
    plan.notices = [...notices.values()];
    plan.report.newClassCodes = plan.newClassCodes;
    plan.report.invitations = plan.signIns.filter((s) => s.invite).length;
    plan.report.guardianNotices = plan.notices.length;
    return plan;
  }

  private addNotice(
    notices: Map<string, { email: string; name: string; children: string[] }>,
    row: CheckedRow,
    child: string,
  ): void {
    const n = notices.get(row.guardianEmail!) ?? {
      email: row.guardianEmail!,
      name: row.guardianName!,
      children: [],
    };
    n.children.push(child);
    notices.set(row.guardianEmail!, n);
  }

  /** Writes the plan with set-based statements (one per table), all in the caller's transaction. */
  private async apply(
    em: EntityManager,
    caller: Caller,
    plan: Plan,
    fileName: string,
    report: Report,
  ): Promise<void> {
    const org = caller.organisationId;
    let stepsDone = 0;
    const step = (name: (typeof WRITE_STEPS)[number]) =>
      report({ phase: 'writing', done: stepsDone++, total: WRITE_STEPS.length, step: name });
    step('Creating new classes');
    const orgName = (await em.findOneByOrFail(Organisation, { id: org })).name;

    // New classes, taught by the importer when they teach.
    let createdClasses: Record<string, string>[] = [];
    if (plan.newClassCodes.length) {
      createdClasses = await bulkInsert(
        em,
        'classes',
        [
          { name: 'organisation_id', type: 'uuid' },
          { name: 'name', type: 'text' },
          { name: 'code', type: 'text' },
        ],
        plan.newClassCodes.map((code) => [org, code, code]),
        'id, code',
      );
      if (caller.roles.includes('teacher')) {
        await em.query(
          `INSERT INTO class_teachers (class_id, membership_id) SELECT unnest($1::uuid[]), $2`,
          [createdClasses.map((c) => c.id), caller.membershipId],
        );
      }
    }

    step('Creating sign-ins for new students');
    // People and memberships for new sign-ins.
    const membershipByPupil = new Map<string, string>();
    const newPeople = plan.signIns.filter((s) => !s.personId);
    if (newPeople.length) {
      const people = await bulkInsert(
        em,
        'people',
        [
          { name: 'email', type: 'text' },
          { name: 'display_name', type: 'text' },
        ],
        newPeople.map((s) => [s.email, s.displayName]),
        'id, email',
      );
      const idByEmail = new Map(people.map((p) => [p.email!, p.id!]));
      for (const s of newPeople) s.personId = idByEmail.get(s.email)!;
    }
    const needMembership = plan.signIns.filter((s) => !s.membershipId);
    if (needMembership.length) {
      const ms = (await em.query(
        `INSERT INTO memberships (organisation_id, person_id, roles) SELECT $1, p, ARRAY['student']::text[] FROM unnest($2::uuid[]) AS p RETURNING id, person_id`,
        [org, needMembership.map((s) => s.personId)],
      )) as { id: string; person_id: string }[];
      const byPerson = new Map(ms.map((m) => [m.person_id, m.id]));
      for (const s of needMembership) s.membershipId = byPerson.get(s.personId!)!;
    }
    const addRole = plan.signIns.filter((s) => s.addRole).map((s) => s.membershipId);
    if (addRole.length) {
      await em.query(
        `UPDATE memberships SET roles = roles || ARRAY['student']::text[] WHERE organisation_id = $1 AND id = ANY($2)`,
        [org, addRole],
      );
    }
    for (const s of plan.signIns) {
      membershipByPupil.set(s.pupilNumber, s.membershipId!);
    }

    step('Preparing the rows');
    // New students get their ids here, so nothing is mapped back from RETURNING; class places
    // join by the ids of the classes found or just created. Each table is then one statement of
    // column arrays through unnest() (a few parameters, however many rows).
    const newIds = new Map(plan.newStudents.map((n) => [n.pupilNumber!, randomUUID()]));
    const idOf = (key: StudentKey): string => ('id' in key ? key.id : newIds.get(key.pupilNumber)!);
    for (const c of createdClasses) plan.classIds.set(c.code!, c.id!);

    step('Writing students');
    if (plan.newStudents.length) {
      const n = plan.newStudents;
      await em.query(
        `INSERT INTO students (id, organisation_id, membership_id, pupil_number, given_name, family_name, email, date_of_birth, grade)
         SELECT u.id, $1, u.membership_id, u.pupil_number, u.given_name, u.family_name, u.email, u.date_of_birth, u.grade
           FROM unnest($2::uuid[], $3::uuid[], $4::text[], $5::text[], $6::text[], $7::text[], $8::date[], $9::integer[])
             AS u(id, membership_id, pupil_number, given_name, family_name, email, date_of_birth, grade)`,
        [
          org,
          n.map((r) => newIds.get(r.pupilNumber!)),
          n.map((r) => membershipByPupil.get(r.pupilNumber!) ?? null),
          n.map((r) => r.pupilNumber),
          n.map((r) => r.givenName),
          n.map((r) => r.familyName),
          n.map((r) => r.studentEmail),
          n.map((r) => r.dateOfBirth),
          n.map((r) => r.grade),
        ],
      );
    }
    if (plan.updates.length) {
      // A blank optional cell keeps what is stored.
      const u = plan.updates;
      await em.query(
        `UPDATE students s SET given_name = u.given_name, family_name = u.family_name, email = u.email,
                date_of_birth = u.date_of_birth, grade = u.grade
           FROM unnest($2::uuid[], $3::text[], $4::text[], $5::text[], $6::date[], $7::integer[])
             AS u(id, given_name, family_name, email, date_of_birth, grade)
          WHERE s.id = u.id AND s.organisation_id = $1`,
        [
          org,
          u.map((x) => x.student.id),
          u.map((x) => x.row.givenName),
          u.map((x) => x.row.familyName),
          u.map((x) => x.row.studentEmail ?? x.student.email),
          u.map((x) => x.row.dateOfBirth),
          u.map((x) => x.row.grade ?? x.student.grade),
        ],
      );
    }
    step('Writing guardians and class places');
    if (plan.newGuardians.length) {
      const g = plan.newGuardians;
      await em.query(
        `INSERT INTO guardians (organisation_id, student_id, name, email)
         SELECT $1, u.student_id, u.name, u.email FROM unnest($2::uuid[], $3::text[], $4::text[]) AS u(student_id, name, email)`,
        [org, g.map((x) => idOf(x.key)), g.map((x) => x.name), g.map((x) => x.email)],
      );
    }
    if (plan.classJoins.length) {
      const j = plan.classJoins;
      await em.query(
        `INSERT INTO class_members (class_id, student_id) SELECT * FROM unnest($1::uuid[], $2::uuid[])
         ON CONFLICT DO NOTHING`,
        [j.map((x) => plan.classIds.get(x.classCode)!), j.map((x) => idOf(x.key))],
      );
    }
    if (plan.guardianRenames.length) {
      await em.query(
        `UPDATE guardians g SET name = u.name FROM unnest($2::uuid[], $3::text[]) AS u(id, name) WHERE g.id = u.id AND g.organisation_id = $1`,
        [org, plan.guardianRenames.map((g) => g.id), plan.guardianRenames.map((g) => g.name)],
      );
    }

    step('Queueing invitations and notices');
    // E-mails: invitations for new sign-ins, notices with a consent link for guardians of minors.
    const invites = plan.signIns.filter((s) => s.invite);
    const mails: NewMail[] = [];
    if (plan.notices.length) {
      // A new consent link covers all of the guardian's children; older unanswered ones are retired.
      await em.query(
        `UPDATE account_tokens SET revoked_at = now() WHERE purpose = 'guardian_consent' AND organisation_id = $1
            AND guardian_email = ANY($2) AND used_at IS NULL AND revoked_at IS NULL`,
        [org, plan.notices.map((n) => n.email)],
      );
    }
    const links = await this.invitations.createLinks(em, [
      ...invites.map((s) => ({
        purpose: 'invitation' as const,
        personId: s.personId!,
        organisationId: org,
        guardianEmail: null,
      })),
      ...plan.notices.map((n) => ({
        purpose: 'guardian_consent' as const,
        personId: null,
        organisationId: org,
        guardianEmail: n.email,
      })),
    ]);
    const linkByPerson = new Map(links.filter((l) => l.personId).map((l) => [l.personId!, l.id]));
    const linkByGuardian = new Map(
      links.filter((l) => l.guardianEmail).map((l) => [l.guardianEmail!, l.id]),
    );
    for (const s of invites) {
      mails.push({
        organisationId: org,
        kind: 'invitation',
        toAddress: s.email,
        toName: s.displayName,
        data: { organisationName: orgName, displayName: s.displayName },
        accountTokenId: linkByPerson.get(s.personId!)!,
      });
    }
    for (const n of plan.notices) {
      mails.push({
        organisationId: org,
        kind: 'guardian_notice',
        toAddress: n.email,
        toName: n.name,
        data: { organisationName: orgName, guardianName: n.name, children: n.children },
        accountTokenId: linkByGuardian.get(n.email)!,
      });
    }
    if (mails.length) await this.mail.enqueue(em, mails);

    step('Saving the import');
    const c = plan.report.counts;
    await this.audit.record(
      {
        action: 'classes.imported',
        entity: 'class_import',
        entityId: randomUUID(),
        after: {
          fileName,
          rows: plan.report.rowCount,
          new: c.new,
          updated: c.updated,
          unchanged: c.unchanged,
          newClasses: plan.newClassCodes,
          invitations: invites.length,
          guardianNotices: plan.notices.length,
        },
      },
      em,
    );
  }
}
