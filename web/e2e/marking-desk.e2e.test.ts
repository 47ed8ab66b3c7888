import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { CellValue, DeskView } from '@stavemark/shared';
import { BASE_URL, launch, screenshot, type Session } from './support/browser';
import { DEMO, DEMO_PASSWORD, navLink, signIn } from './support/sign-in';

/** The API's view of the desk, read with a sign-in of its own (not through the page). */
async function deskFromApi(slotId: string): Promise<DeskView> {
  const login = await fetch(`${BASE_URL}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: DEMO.examiner, password: DEMO_PASSWORD }),
  });
  const { accessToken } = (await login.json()) as { accessToken: string };
  const res = await fetch(`${BASE_URL}/api/slots/${slotId}/desk`, {
    headers: { Authorization: `Bearer ${accessToken}` },
  });
  expect(res.status).toBe(200);
  return (await res.json()) as DeskView;
}

describe('the examiner marks a candidate at the desk', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('flags while playing, writes up by keyboard through a dropped connection and a reload, and submits', async () => {
    const { page, context } = s;
    await signIn(page, DEMO.examiner);
    await navLink(page, 'Marking').click();
    await page.getByRole('heading', { name: 'Marking today', level: 1 }).waitFor();
    const first = page.getByRole('table').first().getByRole('link').first();
    const candidate = (await first.textContent())!.trim();
    await first.click();
    await page.getByRole('heading', { name: new RegExp(candidate) }).waitFor();
    const slotId = new URL(page.url()).pathname.split('/').at(-1)!;

    // Open the sitting on its day if nobody has yet, then start the slot (the draw happens now).
    const openSitting = page.getByRole('button', { name: 'Start the sitting' });
    if (await openSitting.isVisible()) await openSitting.click();
    await page.getByRole('button', { name: 'Start the slot' }).click();
    const title = page.locator('#current-request');
    await title.waitFor();
    expect(await page.getByText('Request 1 of').count()).toBe(1);

    // While playing: one key per flag, with a visible count; arrows move between requests.
    const expected = new Map<string, CellValue>();
    await page.keyboard.press('f');
    await page.keyboard.press('f');
    await page.keyboard.press('r');
    await expect.poll(() => page.getByTestId('count-slip').textContent()).toBe('2');
    expect(await page.getByTestId('count-restart').textContent()).toBe('1');
    expected.set('flag:0:slip', 2).set('flag:0:restart', 1);
    await page.keyboard.press('ArrowRight');
    await page.getByText('Request 2 of').waitFor();
    await page.keyboard.press('p');
    await expect.poll(() => page.getByTestId('count-prompted').textContent()).toBe('1');
    expected.set('flag:1:prompted', 1);
    await page.getByText('All changes saved').waitFor();
    await screenshot(page, 'marking-desk-playing');

    // The write-up: every criterion of every request and every comment, by keyboard only.
    await page.keyboard.press('w');
    const stops = page.locator('[data-desk-stop]');
    await stops.first().waitFor();
    const total = await stops.count();
    expect(total).toBeGreaterThan(4);
    await stops.first().focus();
    const half = Math.floor(total / 2);
    const typeStop = async (i: number) => {
      const el = page.locator(':focus');
      const cell = (await el.getAttribute('data-cell'))!;
      const tag = await el.evaluate((e) => e.tagName);
      if (tag === 'TEXTAREA') {
        const text = `Steady pulse; comment ${i}`;
        await page.keyboard.type(text);
        await page.keyboard.press('Enter'); // saves and moves on
        expected.set(cell, text);
      } else {
        const mark = (i % 3) + 2; // every criterion here is out of 4 or more
        await page.keyboard.press(String(mark)); // sets the mark and moves on
        expected.set(cell, mark);
      }
    };
    for (let i = 0; i < half; i++) await typeStop(i);
    await page.getByText('All changes saved').waitFor();

    // The connection drops part-way: changes wait in the queue, and the desk says so.
    await context.setOffline(true);
    const offlineStops = Math.min(3, total - half);
    for (let i = half; i < half + offlineStops; i++) await typeStop(i);
    await page.getByText(`Offline — ${offlineStops} changes queued`).waitFor();

    // Reload while saves still cannot get through (the API for marks unreachable): nothing is lost.
    await page.route('**/api/mark-sheets/**', (route) => route.abort('connectionrefused'));
    await context.setOffline(false);
    await page.reload();
    await page.getByText(`Offline — ${offlineStops} changes queued`).waitFor();
    await screenshot(page, 'marking-desk-offline-queue');
    // Back online: the queue drains in order.
    await page.unroute('**/api/mark-sheets/**');
    await page.getByText('All changes saved').waitFor({ timeout: 15_000 });

    await stops.nth(half + offlineStops).focus();
    for (let i = half + offlineStops; i < total; i++) await typeStop(i);
    await page.getByLabel('Completed').check();
    expected.set('outcome', 'completed');
    await page.getByText('All changes saved').waitFor();
    await screenshot(page, 'marking-desk-write-up');

    await page.getByRole('button', { name: 'Submit sheet' }).click();
    await page.getByRole('button', { name: 'Yes, submit' }).click();
    await page.getByText('Submitted — read-only').waitFor();
    expect(await page.locator('textarea').first().isDisabled()).toBe(true);

    // The sheet the API holds is exactly what was typed.
    const desk = await deskFromApi(slotId);
    expect(desk.sheet?.status).toBe('submitted');
    const stored = new Map(desk.sheet!.cells.map((c) => [c.cell, c.value]));
    expect(Object.fromEntries(stored)).toEqual(Object.fromEntries(expected));

    // A later change is a correction with a reason; the API then holds the corrected mark.
    const firstMark = [...expected.keys()].find((k) => k.startsWith('mark:'))!;
    await page.getByText('Correct a mark').click();
    await page.getByLabel('Mark', { exact: true }).selectOption(firstMark);
    await page.getByLabel('New mark').fill('1');
    await page.getByLabel('Reason').fill('Misheard the last octave');
    await page.getByRole('button', { name: 'Record correction' }).click();
    await page.getByText('Correction recorded with its reason.').waitFor();
    const after = await deskFromApi(slotId);
    expect(after.sheet!.cells.find((c) => c.cell === firstMark)?.value).toBe(1);
    expect(s.problems).toEqual([]);
  });
});
