import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

// The band policy on the demo school (issue 7 §1): a teacher reads it; the admin saves a new
// version from the School menu. The journey saves the same thresholds again, so the later
// journeys of this suite (one server, one database) band their results as before.
describe('the band policy', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    expect(s.problems).toEqual([]);
    await s?.close();
  });

  it('a teacher reads each band and its range; there is nothing to change', async () => {
    const { page } = s;
    await signIn(page, DEMO.teacher);
    await navLink(page, 'Band policy').click();
    const bands = page.getByRole('table', { name: 'Current bands' });
    await bands.waitFor();
    expect(await bands.getByRole('row', { name: /Distinction/ }).textContent()).toContain('80 % and above');
    expect(await bands.getByRole('row', { name: /Not yet passed/ }).textContent()).toContain('below 55 %');
    expect(await page.getByRole('button', { name: /Save as version/ }).count()).toBe(0);
  });

  it('the admin is told when thresholds are out of order, then saves a new version', async () => {
    const { page } = s;
    await signIn(page, DEMO.admin);
    await navLink(page, 'Band policy').click();
    const subtitle = await page.getByText(/^Version \d+ · bands/).textContent();
    const version = Number(/Version (\d+)/.exec(subtitle!)![1]);
    const merit = page.getByLabel('Band 2: lowest share (%)');
    const was = await merit.inputValue();
    await merit.fill('95');
    await page.getByRole('button', { name: `Save as version ${version + 1}` }).click();
    await page.getByText('List bands from the highest threshold down, each lower than the one before.').waitFor();
    await screenshot(page, 'band-policy-error');
    await merit.fill(was);
    await page.getByRole('button', { name: `Save as version ${version + 1}` }).click();
    await page.getByText(`Saved as version ${version + 1}.`).waitFor();
    const newest = page.getByRole('table', { name: 'Versions of the band policy' }).getByRole('row').nth(1);
    expect(await newest.textContent()).toContain(`${version + 1}Distinction 80 % · Merit ${was} %`);
    expect(await newest.textContent()).toContain('by Morwenna Tilley');
    await screenshot(page, 'band-policy-saved');
  });
});
