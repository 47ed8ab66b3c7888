import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

// Issue 8's journey on the demo school: the demo student (Ellis Northcott) opens Progress and sees
// a year of mock sittings, then switches a chart to its table view.
describe('a student views their progress over a year', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('sees a year of sittings, switches the overall chart to its table, and the absent sitting says so', async () => {
    const { page } = s;
    await signIn(page, DEMO.student);
    await navLink(page, 'Progress').click();
    await page.getByRole('heading', { name: 'Your progress', level: 1 }).waitFor();
    await page.getByRole('img', { name: 'Overall percentage per sitting' }).waitFor();
    // Let the chart draw before the picture.
    await page.waitForTimeout(300);
    await screenshot(page, 'progress-1-student-charts');

    const card = page.getByRole('region', { name: 'Overall percentage' });
    await card.getByRole('button', { name: 'Show table' }).click();
    const rows = card.getByRole('table').getByRole('row');
    // A header and one row per sitting: eight released Grade 5 mocks over the year, one absent.
    // (The release journey, earlier in the suite, may have released one more for Ellis today.)
    expect(await rows.count()).toBeGreaterThanOrEqual(1 + 8);
    expect(await rows.count()).toBeLessThanOrEqual(1 + 9);
    const texts = await rows.allInnerTexts();
    expect(texts.filter((t) => /Absent/.test(t))).toHaveLength(1);
    const dates = texts.slice(1).map((t) => t.split('\t')[0]);
    // One row per sitting: no date twice.
    expect(new Set(dates).size).toBe(dates.length);
    await expect(card.getByRole('button', { name: 'Show chart' }).getAttribute('aria-pressed')).resolves.toBe('true');
    await page.getByRole('note', { name: 'Health caution' }).first().waitFor();
    await card.scrollIntoViewIfNeeded();
    await screenshot(page, 'progress-2-student-table');

    await page.getByRole('heading', { name: 'Examiners’ comments' }).scrollIntoViewIfNeeded();
    await screenshot(page, 'progress-3-comments');
  });
});
