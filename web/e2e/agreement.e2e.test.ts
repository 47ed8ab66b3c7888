import { randomUUID } from 'node:crypto';
import { afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { DeskView } from '@stavemark/shared';
import { ApiAs } from './support/api-as';
import { join } from 'node:path';
import { launch, screenshot, SCREENSHOT_DIR, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

/**
 * The agreement report in the browser. Set-up through the API: today, a sitting of 30 demo
 * candidates, every slot double-marked by Priya (who leads) and Ottilie, both sheets submitted.
 * Priya marks one mark lower than Ottilie on two criteria of every request, so she comes out
 * as the more severe marker; candidates differ, so the totals spread.
 */
const run = Date.now().toString(36);
const TITLE = `Agreement check ${run}`;

async function markAll(as: ApiAs, desk: DeskView, fraction: number, lower: number) {
  const sheetId = desk.sheet!.id;
  const cells: [string, unknown][] = [];
  for (const r of desk.requests)
    r.criteria.forEach((c, ci) => {
      const m = Math.round(fraction * c.maxMark) - (ci < 2 ? lower : 0);
      cells.push([`mark:${r.index}:${c.key}`, Math.max(0, Math.min(c.maxMark, m))]);
    });
  cells.push(['outcome', 'completed']);
  let last = '';
  // A few at a time: each cell is its own save.
  for (let i = 0; i < cells.length; i += 8) {
    await Promise.all(
      cells.slice(i, i + 8).map(([cell, value]) => {
        const changeId = randomUUID();
        last = changeId;
        return as.call('POST', `/mark-sheets/${sheetId}/cells`, { changeId, cell, value, baseVersion: 0 });
      }),
    );
  }
  await as.call('POST', `/mark-sheets/${sheetId}/submit`, { lastChangeId: last, confirm: true });
}

describe('the agreement report', () => {
  let s: Session;
  let sittingId: string;

  beforeAll(async () => {
    const teacher = new ApiAs(DEMO.teacher);
    const priya = new ApiAs(DEMO.examiner);
    const ottilie = new ApiAs('ottilie.brandt@demo.example');
    const { date } = await teacher.call<{ date: string }>('GET', '/today');
    const lists = await teacher.call<{ starterKey: string | null; published: { id: string } | null }[]>('GET', '/requirement-lists');
    const g1 = lists.find((l) => l.starterKey === 'grade-1')!.published!.id;
    const examiners = await teacher.call<{ id: string; email: string }[]>('GET', '/examiners');
    const id = (email: string) => examiners.find((e) => e.email === email)!.id;
    const students = await teacher.call<{ id: string; pupilNumber: string }[]>('GET', '/students?search=KL');
    const created = await teacher.call<{ id: string }>('POST', '/sittings', {
      title: TITLE,
      date,
      room: `Agreement Room ${run}`,
      dayStart: '12:30',
      dayEnd: '19:45',
      papers: [{ listVersionId: g1, slotMinutes: 8 }],
      examinerIds: [id(DEMO.examiner), id('ottilie.brandt@demo.example')],
    });
    sittingId = created.id;
    const chosen = students.filter((x) => /^KL10/.test(x.pupilNumber)).sort((a, b) => a.pupilNumber.localeCompare(b.pupilNumber)).slice(0, 30);
    expect(chosen).toHaveLength(30);
    // All on the Grade 1 list, whatever grade each is recorded in (the API otherwise places each on
    // the list of their grade, and this sitting has one).
    const added = await teacher.call<{ added: number; skipped: unknown[] }>('POST', `/sittings/${sittingId}/candidates`, {
      studentIds: chosen.map((c) => c.id),
      listVersionId: g1,
    });
    expect(added.skipped).toEqual([]);
    expect(added.added).toBe(30);
    await teacher.call('POST', `/sittings/${sittingId}/double-marking`, { share: 100 });
    await teacher.call('POST', `/sittings/${sittingId}/status`, { status: 'scheduled' });
    const open = await teacher.call<{ slots: { id: string }[] }>('POST', `/sittings/${sittingId}/status`, { status: 'in_progress' });
    for (const [i, slot] of open.slots.entries()) {
      const fraction = 0.45 + ((i * 7) % 11) / 20; // 0.45 … 0.95, spread over the day
      const first = await priya.call<DeskView>('POST', `/slots/${slot.id}/start`);
      const second = await ottilie.call<DeskView>('POST', `/slots/${slot.id}/start`);
      await Promise.all([markAll(priya, first, fraction, 1), markAll(ottilie, second, fraction, 0)]);
    }
  }, 600_000);

  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    expect(s.problems).toEqual([]);
    await s?.close();
  });

  it('from the sitting: ICC with its form, interval and reading, kappa per pair, severity as a chart and a table, sources named', async () => {
    const { page } = s;
    await signIn(page, DEMO.teacher);
    await page.goto(`${new URL(page.url()).origin}/sittings/${sittingId}`);
    await page.getByRole('heading', { name: new RegExp(TITLE) }).waitFor();
    await page.getByRole('button', { name: 'Agreement report' }).click();
    await page.getByRole('heading', { name: 'Agreement on totals: ICC(2,1)' }).waitFor();
    // Read the count itself, so a failure says what the page showed.
    expect(await page.getByText(/double-marked candidates? with both sheets submitted/).first().textContent()).toContain('30 double-marked candidates with both sheets submitted');
    expect(await page.getByText(/The same two examiners \(Ottilie Brandt and Priya Halvorsen\) marked every candidate/).count()).toBe(1);
    const icc = Number((await page.getByTestId('icc-value').textContent())!.replace('−', '-'));
    expect(icc).toBeGreaterThan(0);
    expect(icc).toBeLessThan(1);
    // 30 candidates: interpreted, on a named scale.
    expect(await page.getByText(/on the scale of Koo & Li \(2016\)/).count()).toBeGreaterThan(0);
    expect(await page.getByText(/Koo, T\. K\., & Li, M\. Y\. \(2016\)\. A guideline/).count()).toBe(1);
    expect(await page.getByText(/Landis, J\. R\., & Koch, G\. G\. \(1977\)/).count()).toBeGreaterThan(0);
    const pair = page.getByRole('row', { name: /Ottilie Brandt and Priya Halvorsen|Priya Halvorsen and Ottilie Brandt/ });
    expect(await pair.getByRole('cell').nth(1).textContent()).toBe('30');
    // Severity: 30 sheets each (from 20 shown): Priya lower than Ottilie.
    const severity = page.getByRole('table', { name: 'Severity of each examiner' });
    const priyaRow = severity.getByRole('row', { name: /Priya Halvorsen/ });
    expect(await priyaRow.getByRole('cell').nth(1).textContent()).toBe('30');
    expect(await priyaRow.getByRole('cell').last().textContent()).toBe('more severe');
    expect(await severity.getByRole('row', { name: /Ottilie Brandt/ }).getByRole('cell').last().textContent()).toBe('more lenient');
    const chart = page.getByRole('img', { name: /^Severity chart\. .*Priya Halvorsen: −/ });
    await chart.waitFor();
    await screenshot(page, 'agreement-report-sitting');
    await chart.screenshot({ path: join(SCREENSHOT_DIR, 'agreement-report-severity-chart.png') });
  });

  it('from the Agreement entry: a term pools its sittings', async () => {
    const { page } = s;
    await signIn(page, DEMO.admin);
    await navLink(page, 'Agreement').click();
    await page.getByRole('heading', { name: 'Agreement between examiners', level: 1 }).waitFor();
    // The term holding today (the API's own list says which).
    const admin = new ApiAs(DEMO.admin);
    const { date } = await admin.call<{ date: string }>('GET', '/today');
    const { terms } = await admin.call<{ terms: { id: string; startsOn: string; endsOn: string }[] }>('GET', '/agreement/scopes');
    const term = terms.find((t) => t.startsOn <= date && date <= t.endsOn)!;
    await page.getByLabel('Report on').selectOption(`term:${term.id}`);
    await page.getByRole('heading', { name: /Agreement on totals/ }).waitFor();
    expect(await page.getByText(/\d+ sittings? from .*double-marked candidates/).count()).toBe(1);
    // The sitting set up above is in it, with its 30 candidates at least.
    const n = Number((await page.getByText(/(\d+) double-marked candidates with both sheets/).textContent())!.match(/(\d+) double-marked/)![1]);
    expect(n).toBeGreaterThanOrEqual(30);
    await screenshot(page, 'agreement-report-term');
  });
});
