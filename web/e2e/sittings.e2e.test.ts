import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, signIn } from './support/sign-in';

// Issue 5's journey on the demo school: a teacher plans a sitting for a class, gives one
// candidate extra time, schedules it and prints the day. The date is far ahead, so it meets
// nothing else the suites plan.
const run = Date.now().toString(36);
const ROOM = `Browser room ${run}`;
const TITLE = `Grade 3 mock ${run}`;
// A day of 2032 of this run's own, so a run again on the same database meets nothing it planned before.
const DATE = new Date(Date.UTC(2032, 0, 1) + (Math.floor(Date.now() / 1000) % 365) * 86_400_000)
  .toISOString()
  .slice(0, 10);

describe('a teacher plans a sitting', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('for a class with one candidate on extra time, schedules it, and prints the day schedule', async () => {
    const { page } = s;
    await signIn(page, DEMO.teacher);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Sittings' })
      .click();
    await page.getByRole('heading', { name: 'Sittings', level: 1 }).waitFor();
    // today's demo sitting is listed
    await page.getByRole('link', { name: 'Grade 5 mock — Thursday Seniors' }).waitFor();

    // 1. Plan: the day, a break, the grade 3 list and the lead examiner.
    await page.getByRole('button', { name: 'Plan a sitting' }).click();
    const plan = page.getByRole('dialog', { name: 'Plan a sitting' });
    await plan.waitFor();
    await plan.getByLabel('Title').fill(TITLE);
    await plan.getByLabel('Date').fill(DATE);
    await plan.getByLabel('Room').fill(ROOM);
    await plan.getByLabel('First slot from').fill('09:00');
    await plan.getByLabel('Last slot ends by').fill('12:00');
    await plan.getByRole('button', { name: 'Add a break' }).click();
    await plan.getByLabel('Label').fill('Coffee');
    await plan.getByText('Grade 3 technique', { exact: false }).click();
    await plan.getByText('Priya Halvorsen').click();
    await plan.getByRole('button', { name: 'Plan the sitting' }).click();
    await page.getByRole('heading', { name: new RegExp(TITLE), level: 1 }).waitFor();

    // 2. Candidates from the class: grade 3 in, grade 4 left out with the reason.
    await page.getByRole('button', { name: 'Add candidates' }).click();
    const add = page.getByRole('dialog', { name: 'Add candidates from a class' });
    await add.locator('.p-dropdown').first().click();
    await page.getByRole('option', { name: /^Wednesday Intermediates/ }).click();
    await add.getByRole('button', { name: 'Add candidates' }).click();
    await add.getByText('no grade 4 list in this sitting', { exact: false }).first().waitFor();
    await add.getByRole('button', { name: 'Done' }).click();
    const slots = page.getByRole('region', { name: /^Slots/ }).getByRole('table');
    await slots.getByRole('row').filter({ hasText: 'Kaia Gorsedd' }).waitFor();
    expect(await slots.getByRole('row').count()).toBe(6); // header + 5
    const first = slots.getByRole('row').nth(1);
    expect(await first.getByRole('cell').first().textContent()).toMatch(/^09:00–09:\d\d/);

    // 3. Kaia's access arrangement: 25 % extra time lengthens her slot.
    const kaia = slots.getByRole('row').filter({ hasText: 'Kaia Gorsedd' });
    await page.getByRole('button', { name: 'Access arrangement for Kaia Gorsedd' }).click();
    const arr = page.getByRole('dialog', { name: 'Access arrangement: Kaia Gorsedd' });
    await arr.getByLabel('Extra time (%)').fill('25');
    await arr.getByRole('button', { name: 'Save arrangement' }).click();
    await arr.waitFor({ state: 'hidden' });
    await kaia.getByText('25 % extra time').waitFor();
    // longer than a classmate's slot on the same list without an arrangement
    const mira = slots.getByRole('row').filter({ hasText: 'Mira Gadsby' });
    const minutes = async (row: typeof kaia) =>
      Number.parseInt((await row.getByRole('cell').nth(3).textContent()) ?? '', 10);
    expect(await minutes(kaia)).toBeGreaterThan(await minutes(mira));
    await screenshot(page, 'sittings-1-plan');

    // 4. Schedule: versions pinned, invitations sent.
    await page.getByRole('button', { name: 'Schedule and send invitations' }).click();
    await page
      .getByRole('dialog', { name: 'Schedule and send invitations?' })
      .getByRole('button', { name: 'Schedule and send invitations' })
      .click();
    await page
      .getByRole('heading', { name: new RegExp(TITLE), level: 1 })
      .getByText('Scheduled')
      .waitFor();
    await page.getByText('band policy v', { exact: false }).waitFor();

    // 5. The printable day schedule, by room.
    await page.getByRole('button', { name: 'Day schedule' }).click();
    await page.getByRole('heading', { name: 'Day schedule', level: 1 }).waitFor();
    const room = page.getByRole('region', { name: ROOM });
    await room.getByRole('cell', { name: 'Kaia Gorsedd' }).waitFor();
    expect(await room.getByRole('row').count()).toBe(6);
    await screenshot(page, 'sittings-2-day-schedule');
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    await screenshot(page, 'sittings-3-day-schedule-print');
    await page.emulateMedia({ media: 'screen' });
    expect(s.problems).toEqual([]);
  });

  it('the examiner sees today’s demo sitting with the slots she marks, without planning controls', async () => {
    const { page } = s;
    await signIn(page, DEMO.examiner);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Sittings' })
      .click();
    await page.getByRole('link', { name: 'Grade 5 mock — Thursday Seniors' }).click();
    await page
      .getByRole('heading', { name: /Grade 5 mock — Thursday Seniors/, level: 1 })
      .waitFor();
    const slots = page.getByRole('region', { name: /^Slots/ }).getByRole('table');
    await slots.getByRole('row').filter({ hasText: 'Ellis Northcott' }).waitFor();
    expect(await slots.getByRole('row').count()).toBe(6); // header + 5
    // no planning controls for an examiner
    expect(await page.getByRole('button', { name: 'Add candidates' }).count()).toBe(0);
    await screenshot(page, 'sittings-4-examiner');
    expect(s.problems).toEqual([]);
  });

  it('a student sees their own slot time and nothing of anyone else', async () => {
    const { page } = s;
    await signIn(page, DEMO.student);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Sittings' })
      .click();
    const row = page.getByRole('row').filter({ hasText: 'Grade 5 mock — Thursday Seniors' });
    await row.waitFor();
    expect(await row.textContent()).toContain('09:30–');
    await row.getByRole('link').click();
    await page.getByRole('heading', { name: 'Your slot' }).waitFor();
    const table = page.getByRole('region', { name: 'Your slot' }).getByRole('table');
    expect(await table.getByRole('row').count()).toBe(2); // header + their own
    expect(await table.textContent()).toContain('Ellis Northcott');
    expect(await page.getByText('Wren Ashdown').count()).toBe(0);
    await screenshot(page, 'sittings-5-student');
    expect(s.problems).toEqual([]);
  });
});
