// The demo school's sittings, relative to the seed day: today's sitting for examiner@demo.example
// (so the marking desk has something to open) and three past ones with outcomes recorded, for
// results and progress to hang on later. Laid out with the same computations as the service.
import type { EntityManager } from 'typeorm';
import { DEFAULT_BAND_POLICY, parseClock, type SittingBreak, type SlotOutcome } from '@stavemark/shared';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { toLineView } from '../requirement-lists/requirement-lists.mapper.js';
import { candidateMinutes, paperMinutes, planDay } from './day-plan.js';
import { spreadIndices } from './double-marking.js';
import { AccessArrangement } from './entities/access-arrangement.entity.js';
import { BandPolicyVersion } from './entities/band-policy.entity.js';
import { SittingExaminer } from './entities/sitting-examiner.entity.js';
import { SittingPaper } from './entities/sitting-paper.entity.js';
import { Sitting } from './entities/sitting.entity.js';
import { Slot } from './entities/slot.entity.js';
import { localToInstant } from './zoned-time.js';

interface DemoSitting {
  title: string;
  daysFromToday: number;
  room: string;
  dayStart: string;
  dayEnd: string;
  breaks: SittingBreak[];
  list: string;
  planner: string;
  panel: string[];
  /** Pupil numbers in the order of the day. */
  candidates: string[];
  status: Sitting['status'];
  doubleMarkShare: number;
  outcomes?: Record<string, SlotOutcome>;
  /** Pupil number → the title of the sitting whose attempt this one re-sits. */
  resits?: Record<string, string>;
}

const DEMO_SITTINGS: DemoSitting[] = [
  {
    title: 'Grade 1 mock — Monday Foundations',
    daysFromToday: -35,
    room: 'Studio 2',
    dayStart: '16:00',
    dayEnd: '18:00',
    breaks: [],
    list: 'grade-1',
    planner: 'teacher@demo.example',
    panel: ['ottilie.brandt@demo.example', 'examiner@demo.example'],
    candidates: ['KL1001', 'KL1003', 'KL1005', 'KL1007', 'KL1009'],
    status: 'in_progress',
    doubleMarkShare: 40,
    outcomes: { KL1001: 'completed', KL1003: 'completed', KL1005: 'incomplete', KL1007: 'completed', KL1009: 'completed' },
  },
  {
    title: 'Grade 3 mock — Wednesday Intermediates',
    daysFromToday: -14,
    room: 'Studio 2',
    dayStart: '16:00',
    dayEnd: '18:30',
    breaks: [],
    list: 'grade-3',
    planner: 'teacher@demo.example',
    panel: ['examiner@demo.example', 'ottilie.brandt@demo.example'],
    candidates: ['KL1011', 'KL1013', 'KL1015', 'KL1017', 'KL1019'],
    status: 'in_progress',
    doubleMarkShare: 40,
    outcomes: { KL1011: 'completed', KL1013: 'completed', KL1015: 'completed', KL1017: 'completed', KL1019: 'absent' },
  },
  {
    title: 'Grade 3 re-sits',
    daysFromToday: -7,
    room: 'Studio 2',
    dayStart: '16:00',
    dayEnd: '17:00',
    breaks: [],
    list: 'grade-3',
    planner: 'teacher@demo.example',
    panel: ['examiner@demo.example'],
    candidates: ['KL1019'],
    status: 'in_progress',
    doubleMarkShare: 0,
    outcomes: { KL1019: 'completed' },
    resits: { KL1019: 'Grade 3 mock — Wednesday Intermediates' },
  },
  {
    title: 'Grade 5 mock — Thursday Seniors',
    daysFromToday: 0,
    room: 'Recital Room',
    dayStart: '09:30',
    dayEnd: '12:00',
    breaks: [{ start: '10:00', end: '10:15', label: 'Break' }],
    list: 'grade-5',
    planner: 'teacher@demo.example',
    panel: ['examiner@demo.example', 'ottilie.brandt@demo.example'],
    candidates: ['KL1021', 'KL1023', 'KL1025', 'KL1027', 'KL1029'],
    status: 'scheduled',
    doubleMarkShare: 40,
  },
];

/** Wren Ashdown has 25 % extra time, so today's schedule shows a lengthened slot. */
const DEMO_ARRANGEMENTS = [{ pupilNumber: 'KL1023', extraTimePercent: 25, restBreakMinutes: 0, notes: 'Approved extra time (processing).' }];

function addDays(date: string, days: number): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10);
}

/** Seeds the demo sittings once: a sitting already there (same title and date) is left alone. */
export async function seedDemoSittings(em: EntityManager, organisationId: string, today: string): Promise<number> {
  const [org] = (await em.query(`SELECT time_zone FROM organisations WHERE id = $1`, [organisationId])) as { time_zone: string }[];
  const tz = org!.time_zone;
  const one = async <T>(sql: string, params: unknown[]): Promise<T> => {
    const rows = (await em.query(sql, params)) as T[];
    if (!rows[0]) throw new Error(`Demo sittings: nothing found for ${sql} ${JSON.stringify(params)}`);
    return rows[0];
  };
  const membership = (email: string) =>
    one<{ id: string }>(`SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = $1 AND m.organisation_id = $2`, [email, organisationId]).then((r) => r.id);
  const student = (pupil: string) =>
    one<{ id: string; given_name: string; family_name: string }>(`SELECT id, given_name, family_name FROM students WHERE pupil_number = $1 AND organisation_id = $2`, [pupil, organisationId]);

  let policy = await em.findOne(BandPolicyVersion, { where: { organisationId }, order: { version: 'DESC' } });
  policy ??= await em.save(em.create(BandPolicyVersion, { organisationId, version: 1, bands: DEFAULT_BAND_POLICY.bands, below: DEFAULT_BAND_POLICY.below, createdByPersonId: null }));

  for (const a of DEMO_ARRANGEMENTS) {
    const s = await student(a.pupilNumber);
    if (await em.findOne(AccessArrangement, { where: { studentId: s.id } })) continue;
    await em.save(em.create(AccessArrangement, { organisationId, studentId: s.id, extraTimePercent: a.extraTimePercent, restBreakMinutes: a.restBreakMinutes, substitutions: [], notes: a.notes, updatedByPersonId: null }));
  }

  let added = 0;
  const slotOf = new Map<string, string>(); // `${title}|${pupil}` → slot id, for re-sit links
  for (const d of DEMO_SITTINGS) {
    const date = addDays(today, d.daysFromToday);
    const existing = await em.findOne(Sitting, { where: { organisationId, title: d.title, date } });
    if (existing) {
      for (const sl of await em.find(Slot, { where: { sittingId: existing.id }, relations: { student: true } })) slotOf.set(`${d.title}|${sl.student!.pupilNumber}`, sl.id);
      continue;
    }
    const { id: listId } = await one<{ id: string }>(`SELECT id FROM requirement_lists WHERE starter_key = $1 AND organisation_id = $2`, [d.list, organisationId]);
    const version = await em.findOne(RequirementListVersion, { where: { listId, status: 'published' }, relations: { lines: { rubricVersion: true } }, order: { version: 'DESC' } });
    if (!version?.lines) throw new Error(`Demo sittings: no published version of starter list ${d.list}`);
    const list = { lines: [...version.lines].sort((a, b) => a.position - b.position).map(toLineView), selectionRule: version.selectionRule };
    const writeUp = 3;
    const scheduled = d.status !== 'draft';
    const sitting = await em.save(
      em.create(Sitting, {
        organisationId,
        title: d.title,
        date,
        room: d.room,
        timeZone: tz,
        startsAt: localToInstant(date, parseClock(d.dayStart), tz),
        endsAt: localToInstant(date, parseClock(d.dayEnd), tz),
        breaks: d.breaks,
        writeUpGapMinutes: writeUp,
        changeoverMinutes: 2,
        status: d.status,
        plannedByMembershipId: await membership(d.planner),
        scheduledAt: scheduled ? localToInstant(addDays(date, -7), 9 * 60, tz) : null,
        bandPolicyId: scheduled ? policy.id : null,
        pinnedRubricVersionIds: scheduled ? [...new Set(list.lines.map((l) => l.rubricVersionId))].sort() : null,
        revision: scheduled ? 1 : 0,
      }),
    );
    // The hook of RequirementListsService.markUsed: a pinned version never changes again.
    if (scheduled) await em.query(`UPDATE requirement_list_versions SET used_at = COALESCE(used_at, now()) WHERE id = $1`, [version.id]);
    const paper = await em.save(em.create(SittingPaper, { organisationId, sittingId: sitting.id, listVersionId: version.id, position: 0, suggestedMinutes: paperMinutes(list, writeUp, null), slotMinutes: null }));
    const panel: string[] = [];
    for (const [position, email] of d.panel.entries()) {
      const mid = await membership(email);
      panel.push(mid);
      await em.save(em.create(SittingExaminer, { organisationId, sittingId: sitting.id, membershipId: mid, position }));
    }
    const people = await Promise.all(d.candidates.map(student));
    const arrangements = await em.find(AccessArrangement, { where: { organisationId } });
    const lengths = people.map((p) => {
      const a = arrangements.find((x) => x.studentId === p.id);
      return candidateMinutes({ list, writeUpGapMinutes: writeUp, fixedMinutes: null, extraTimePercent: a?.extraTimePercent ?? 0, restBreakMinutes: a?.restBreakMinutes ?? 0, substitutions: a?.substitutions ?? [] });
    });
    const plan = planDay({
      dayStart: parseClock(d.dayStart),
      dayEnd: parseClock(d.dayEnd),
      changeoverMinutes: 2,
      breaks: d.breaks.map((b) => ({ start: parseClock(b.start), end: parseClock(b.end) })),
      slots: people.map((p, i) => ({ id: p.id, name: `${p.given_name} ${p.family_name}`, minutes: lengths[i]! })),
    });
    if (plan.problems.length) throw new Error(`Demo sittings: ${d.title}: ${plan.problems[0]!.message}`);
    const doubled = new Set(spreadIndices(people.length, d.doubleMarkShare));
    for (const [i, p] of people.entries()) {
      const placed = plan.placed[i]!;
      const pupil = d.candidates[i]!;
      const outcome = d.outcomes?.[pupil] ?? null;
      const resitOf = d.resits?.[pupil];
      const slot = await em.save(
        em.create(Slot, {
          organisationId,
          sittingId: sitting.id,
          paperId: paper.id,
          studentId: p.id,
          position: i,
          startsAt: localToInstant(date, placed.start, tz),
          endsAt: localToInstant(date, placed.end, tz),
          minutes: lengths[i]!,
          notBefore: null,
          examinerMembershipId: panel[0]!,
          // The panel's others take turns as second marker (one other in the demo panels).
          secondExaminerMembershipId: doubled.has(i) && panel.length > 1 ? panel[1 + (i % (panel.length - 1))]! : null,
          outcome,
          outcomeNote: outcome === 'incomplete' ? 'Stopped after the third request; felt unwell.' : null,
          outcomeRecordedAt: outcome ? localToInstant(date, placed.end, tz) : null,
          outcomeRecordedByPersonId: null,
          resitOfSlotId: resitOf ? (slotOf.get(`${resitOf}|${pupil}`) ?? null) : null,
          ownPupilAckByPersonId: null,
          ownPupilAckAt: null,
        }),
      );
      slotOf.set(`${d.title}|${pupil}`, slot.id);
    }
    added++;
  }
  return added;
}
