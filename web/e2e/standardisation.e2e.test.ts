import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { ExerciseView } from '@stavemark/shared';
import { ApiAs } from './support/api-as';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

const TITLE = 'D major scale — standardisation before the Grade 5 mock';
// What Priya gives, criterion by criterion in the rubric's order (the reference is 10 5 3 3 4 6 3).
const MARKS = [9, 5, 3, 2, 4, 7, 3];

describe('standardisation: an examiner marks a reference performance blind', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    expect(s.problems).toEqual([]);
    await s?.close();
  });

  it('marks by keyboard with the reference hidden, keeps the draft through a reload, submits, then sees the reference and the deviation over time', async () => {
    const { page } = s;
    await signIn(page, DEMO.examiner);
    await navLink(page, 'Standardisation').click();
    await page.getByRole('heading', { name: 'Standardisation', level: 1 }).waitFor();
    await page.getByRole('row', { name: new RegExp(TITLE) }).getByRole('cell').last().getByText('To mark').waitFor();
    await page.getByRole('link', { name: TITLE }).click();
    await page.getByRole('heading', { name: TITLE, level: 1 }).waitFor();
    await page.getByRole('heading', { name: 'Your marks' }).waitFor();
    // Blind: no reference on the page, and none in what the API gave the page.
    expect(await page.getByText('Marks beside the reference').count()).toBe(0);
    const examiner = new ApiAs(DEMO.examiner);
    const before = await examiner.call<ExerciseView>('GET', `/standardisation/exercises/${new URL(page.url()).pathname.split('/').at(-1)}`);
    expect(before.referenceMarks).toBeNull();
    expect(before.othersMarks).toBeNull();
    // The performance plays in the page from its signed address (metadata read by the browser).
    const audio = page.getByLabel('Reference performance');
    await audio.waitFor();
    expect(await audio.getAttribute('src')).toMatch(/^\/api\/media\//);
    await expect.poll(() => audio.evaluate((a) => (a as HTMLAudioElement).duration), { timeout: 15_000 }).toBeGreaterThan(5);
    // The tension criterion carries the health caution.
    expect(await page.getByText(/Persistent tension can contribute to playing-related pain/).count()).toBe(1);

    // Keyboard: a digit marks the focused criterion and moves on.
    const rows = page.locator('[data-std-stop]');
    expect(await rows.count()).toBe(7);
    await rows.first().focus();
    for (const m of MARKS.slice(0, 4)) await page.keyboard.press(String(m));
    await page.getByText('4 of 7 marked · Draft saved').waitFor();
    await screenshot(page, 'standardisation-marking');
    // A reload loses nothing.
    await page.reload();
    await page.getByText('4 of 7 marked · Draft saved').waitFor();
    expect(await page.getByRole('button', { name: 'Note accuracy: 9 of 10' }).getAttribute('aria-pressed')).toBe('true');
    // Submitting early is refused, naming what is missing; nothing is lost.
    await page.getByRole('button', { name: 'Submit my marks' }).click();
    await page.getByText(/3 mark\(s\) missing or wrong/).waitFor();
    expect(await page.getByRole('alert').filter({ hasText: 'has no mark' }).count()).toBe(3);
    await rows.nth(4).focus();
    for (const m of MARKS.slice(4)) await page.keyboard.press(String(m));
    await page.getByRole('button', { name: 'Submit my marks' }).click();

    // Now the reference, the deviation and the agreement of everyone who marked it.
    await page.getByRole('heading', { name: 'Marks beside the reference' }).waitFor();
    const table = page.getByRole('table', { name: 'Request 1: D major scale' });
    const accuracy = table.getByRole('row', { name: /Note accuracy/ });
    expect(await accuracy.getByRole('cell').nth(0).textContent()).toBe('10 / 10');
    expect(await accuracy.getByRole('cell').nth(2).textContent()).toBe('−1');
    // Mean difference: −10 (accuracy), −20 (motion), +10 (evenness) over 7 → −20/7 = −2.9 points.
    expect(await page.getByText('−2.9 points').count()).toBe(1);
    expect(await page.getByTestId('alpha-value').textContent()).toMatch(/^−?\d\.\d{3}$/);
    expect(await page.getByText(/on the scale of Krippendorff \(2004\)/).count()).toBe(1);
    await screenshot(page, 'standardisation-results');

    await page.getByRole('link', { name: 'Standardisation' }).first().click();
    await page.getByRole('link', { name: 'My deviation over time' }).click();
    await page.getByRole('heading', { name: 'My deviation over time', level: 1 }).waitFor();
    await page.getByRole('img', { name: /^Deviation over time\./ }).waitFor();
    const row = page.getByRole('table', { name: 'Deviation per exercise' }).getByRole('row', { name: new RegExp(TITLE) });
    expect(await row.getByRole('cell').nth(3).textContent()).toBe('−2.9');
    await screenshot(page, 'standardisation-deviation-over-time');
  });
});
