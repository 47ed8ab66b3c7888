import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { DeskView, ReleaseListView } from '@stavemark/shared';
import { BASE_URL, launch, screenshot, type Session } from './support/browser';
import { ApiAs } from './support/api-as';
import { DEMO, navLink, signIn } from './support/sign-in';

/**
 * The API as one demo person, for the fixture (not through the page). ApiAs renews through the
 * refresh cookie: the browser suite's access tokens live 5 s, shorter than the fixture takes.
 */
async function tokenFor(email: string): Promise<ApiAs> {
  return new ApiAs(email);
}

async function call<T>(
  token: ApiAs,
  method: string,
  path: string,
  body?: unknown,
  expected = 200,
): Promise<T> {
  return token.call<T>(method, path, body, expected);
}

/** Marks every criterion of the caller's sheet with mark(maxMark), records the outcome and submits. */
async function markSlot(
  token: ApiAs,
  slotId: string,
  mark: (max: number) => number,
): Promise<void> {
  const desk = await call<DeskView>(token, 'POST', `/slots/${slotId}/start`);
  const sheet = desk.sheet!.id;
  let last = '';
  const save = async (cell: string, value: unknown) => {
    last = crypto.randomUUID();
    await call(token, 'POST', `/mark-sheets/${sheet}/cells`, {
      changeId: last,
      cell,
      value,
      baseVersion: 0,
    });
  };
  for (const r of desk.requests)
    for (const c of r.criteria) await save(`mark:${r.index}:${c.key}`, mark(c.maxMark));
  await save('comment:overall', 'A secure, well-prepared set of requests.');
  await save('outcome', 'completed');
  await call(token, 'POST', `/mark-sheets/${sheet}/submit`, { lastChangeId: last, confirm: true });
}

const TITLE = 'Grade 5 moderation evening';

describe('a teacher moderates a flagged pair and releases results; the student reads them', () => {
  let s: Session | undefined;
  let sittingId = '';
  afterEach(async () => {
    await s?.close();
    s = undefined;
  });

  // Fixture through the API: an evening sitting today, both candidates double-marked; one pair
  // agrees, the other is far apart (full marks against half marks), so it is flagged at closing.
  beforeAll(async () => {
    const [teacher, admin, priya, ottilie] = await Promise.all(
      [DEMO.teacher, DEMO.admin, DEMO.examiner, 'ottilie.brandt@demo.example'].map(tokenFor),
    );
    const { date } = await call<{ date: string }>(teacher!, 'GET', '/today');
    const lists = await call<{ starterKey: string | null; published: { id: string } | null }[]>(
      admin!,
      'GET',
      '/requirement-lists',
    );
    const g5 = lists.find((l) => l.starterKey === 'grade-5')!.published!.id;
    const ex = await call<{ id: string; email: string }[]>(admin!, 'GET', '/examiners');
    const id = (email: string) => ex.find((e) => e.email === email)!.id;
    const pupil = async (pn: string) =>
      (
        await call<{ id: string; pupilNumber: string }[]>(admin!, 'GET', `/students?search=${pn}`)
      ).find((x) => x.pupilNumber === pn)!.id;
    const ellis = await pupil('KL1021');
    const other = await pupil('KL1025');
    const created = await call<{ id: string }>(
      teacher!,
      'POST',
      '/sittings',
      {
        title: TITLE,
        date,
        room: 'Studio 3',
        dayStart: '17:00',
        dayEnd: '19:45',
        papers: [{ listVersionId: g5 }],
        examinerIds: [id(DEMO.examiner), id('ottilie.brandt@demo.example')],
      },
      201,
    );
    sittingId = created.id;
    await call(teacher!, 'POST', `/sittings/${sittingId}/candidates`, {
      studentIds: [ellis, other],
    });
    await call(teacher!, 'POST', `/sittings/${sittingId}/double-marking`, { share: 100 });
    await call(teacher!, 'POST', `/sittings/${sittingId}/status`, { status: 'scheduled' });
    const v = await call<{ slots: { id: string; studentId: string }[] }>(
      teacher!,
      'POST',
      `/sittings/${sittingId}/status`,
      { status: 'in_progress' },
    );
    for (const slot of v.slots) {
      const far = slot.studentId === other;
      await markSlot(priya!, slot.id, (max) => (far ? max : Math.round(max * 0.8)));
      await markSlot(ottilie!, slot.id, (max) =>
        far ? Math.ceil(max / 2) : Math.round(max * 0.8),
      );
    }
    await call(teacher!, 'POST', `/sittings/${sittingId}/status`, { status: 'marking_closed' });
  });

  it('resolves the flag with agreed marks, releases with a note, and the student sees the report', async () => {
    s = await launch();
    const { page } = s;
    await signIn(page, DEMO.teacher);
    await navLink(page, 'Sittings').click();
    await page.getByRole('link', { name: TITLE }).click();
    await page.getByRole('button', { name: 'Moderation' }).click();
    await page.getByRole('heading', { name: 'Moderation', level: 1 }).waitFor();
    // Release waits for the flag; the flagged pair is listed first with its reason in words.
    await page.getByText('1 flag open').waitFor();
    const flagged = page.getByRole('article').filter({ hasText: 'Flagged' });
    await flagged.getByText(/Totals \d+ and \d+ differ by \d+ marks/).waitFor();
    await page.getByText('qualified health professional').first().waitFor();
    await screenshot(page, 'moderation-flagged-pair');

    // Releasing now is refused with a clear message.
    await page.goto(`${BASE_URL}/sittings/${sittingId}/release`);
    await page.getByText(/outside tolerance and not resolved yet/).waitFor();
    expect(await page.getByRole('button', { name: /^Release 2 results$/ }).isDisabled()).toBe(true);
    await page.goBack();

    await flagged.getByRole('button', { name: 'Agree marks' }).click();
    const dialog = page.getByRole('dialog', { name: /Agree marks/ });
    await dialog.getByRole('button', { name: 'Start from the second examiner’s marks' }).click();
    // Too short a reason is refused beside the field, nothing is saved.
    await dialog.getByLabel('Why these marks').fill('ok');
    await dialog.getByRole('button', { name: 'Record the agreed marks' }).click();
    await dialog.getByText(/why these marks are agreed/).waitFor();
    await dialog
      .getByLabel('Why these marks')
      .fill('Listened again together: the second examiner’s marks fit the descriptors.');
    await screenshot(page, 'moderation-agree-dialog');
    await dialog.getByRole('button', { name: 'Record the agreed marks' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Marks agreed', { exact: true }).waitFor();
    await page.getByText(/No flag is open/).waitFor();
    await screenshot(page, 'moderation-resolved');

    await page.getByRole('link', { name: 'Release results' }).click();
    await page.getByRole('heading', { name: 'Release results', level: 1 }).waitFor();
    const note = 'Ellis, your scales are even and calm: next, the same ease in the arpeggios.';
    await page.getByLabel('Note for Ellis Northcott').fill(note);
    await page.getByRole('button', { name: 'Release 2 results' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Release', exact: true }).click();
    await page.getByText('2 results released.').waitFor();
    await screenshot(page, 'release-done');
    const teacherToken = await tokenFor(DEMO.teacher);
    const list = await call<ReleaseListView>(teacherToken, 'GET', `/sittings/${sittingId}/release`);
    expect(list.sitting.status).toBe('published');
    expect(list.results.find((r) => r.name === 'Ellis Northcott')?.teacherNote).toBe(note);
    await s.close();

    // The demo student signs in and reads the take-home report and the marks.
    s = await launch();
    const student = s.page;
    await signIn(student, DEMO.student);
    await navLink(student, 'My results').click();
    await student.getByRole('heading', { name: 'My results', level: 1 }).waitFor();
    const row = student.getByRole('row').filter({ hasText: TITLE });
    await row.getByRole('link', { name: 'Read the report' }).click();
    await student.getByRole('heading', { name: 'Take-home report' }).waitFor();
    await student.getByRole('heading', { name: 'What went well' }).waitFor();
    await student.getByRole('heading', { name: 'What to work on next' }).waitFor();
    await student.getByText(note).waitFor();
    await student.getByRole('heading', { name: 'Marks and comments' }).waitFor();
    await student.getByText('A secure, well-prepared set of requests.').first().waitFor();
    await screenshot(student, 'student-take-home-report');
  });
});
