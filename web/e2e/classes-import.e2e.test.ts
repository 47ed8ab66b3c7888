import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

// The journey of issue 4 on the demo school: a teacher imports a class list from seed-data/ that
// has one bad row, reads the error, fixes the file, imports it and sees the class; the invitation
// it sends appears in the admin's Outbox and its link sets a password that signs in.
const SAMPLES = new URL('../../seed-data/class-lists/', import.meta.url).pathname;
const BAD = join(SAMPLES, 'tuesday-beginners-one-bad-row.csv');

describe('a teacher imports a class list', () => {
  let s: Session;
  let work: string;
  beforeAll(() => {
    work = mkdtempSync(join(tmpdir(), 'stavemark-import-'));
  });
  afterAll(() => rmSync(work, { recursive: true, force: true }));
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('checks a file with one bad row, imports the fixed file, and sees the class', async () => {
    const { page } = s;
    await signIn(page, DEMO.teacher);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Classes' })
      .click();
    await page.getByRole('heading', { name: 'Classes', level: 1 }).waitFor();
    await page.getByRole('button', { name: 'Import a class list' }).click();
    const dialog = page.getByRole('dialog', { name: 'Import a class list' });
    await dialog.waitFor();

    // 1. The file as it came, with an impossible date on line 4.
    await dialog.getByLabel('Class list file (CSV)').setInputFiles(BAD);
    await dialog.getByRole('button', { name: 'Check the file' }).click();
    await dialog
      .getByText('1 row has an error, so this file cannot be imported yet.', { exact: false })
      .waitFor();
    const errorRow = dialog.getByRole('row').filter({ hasText: 'KL2103' });
    await expect
      .poll(() => errorRow.textContent())
      .toContain('Date of birth “2017-02-30” is not a real date');
    expect(await errorRow.getByRole('cell').first().textContent()).toBe('4');
    expect(await dialog.getByRole('button', { name: /^Import \d+ rows?$/ }).count()).toBe(0);
    await screenshot(page, 'classes-import-1-error');

    // 2. Fix the file (the date of birth was mistyped) and check it again.
    const fixed = join(work, 'tuesday-beginners.csv');
    writeFileSync(fixed, readFileSync(BAD, 'utf8').replace('2017-02-30', '2017-01-22'));
    await dialog.getByLabel('Class list file (CSV)').setInputFiles(fixed);
    await dialog.getByRole('button', { name: 'Check the file' }).click();
    await dialog.getByText('The file is ready', { exact: false }).waitFor();
    await screenshot(page, 'classes-import-2-ready');

    // 3. Import: one step, all rows.
    await dialog.getByRole('button', { name: 'Import 6 rows' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page
      .getByText(/Imported tuesday-beginners\.csv: 5 new, 1 updated, 0 unchanged/)
      .waitFor();
    const row = page.getByRole('row').filter({ hasText: 'TUE-BEG' });
    await row.waitFor();
    expect(await row.textContent()).toContain('Idris Calloway');

    // 4. The class with its six students and their guardians.
    await row.getByRole('link', { name: 'TUE-BEG' }).click();
    await page.getByRole('heading', { name: 'TUE-BEG', level: 1 }).waitFor();
    await page.getByRole('cell', { name: 'KL2105' }).waitFor();
    const members = page.getByRole('table').filter({ hasText: 'KL2105' });
    expect(await members.getByRole('row').count()).toBe(7); // header + 6
    expect(await members.textContent()).toContain('Tess Ashcombe');
    await screenshot(page, 'classes-import-3-class');
    expect(s.problems).toEqual([]);
  });

  it('the invitation appears in the Outbox, and its link sets a password that signs in', async () => {
    const { page } = s;
    await signIn(page, DEMO.admin);
    await navLink(page, 'Outbox').click();
    await page.getByRole('heading', { name: 'Outbox', level: 1 }).waitFor();
    const invite = page
      .getByRole('row')
      .filter({ hasText: 'saoirse.lambourne@mail.example' })
      .filter({ hasText: 'Welcome to Stavemark' });
    await invite.first().waitFor({ timeout: 20_000 });
    await invite.first().click();
    const mail = page.getByRole('article', { name: 'The chosen e-mail' });
    await mail
      .getByRole('heading', { name: 'Welcome to Stavemark at Kestrel Lane Music School' })
      .waitFor();
    await screenshot(page, 'classes-import-4-outbox');

    // Sign out, then follow the link as Saoirse would.
    const href = await mail
      .getByRole('link', { name: /account\/welcome#token=/ })
      .getAttribute('href');
    expect(href).toMatch(/\/account\/welcome#token=[A-Za-z0-9_-]{43}$/);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.goto(href!);
    await page.getByText('Hello Saoirse Lambourne.', { exact: false }).waitFor();
    // The token has left the address bar.
    expect(page.url()).not.toContain('token=');
    await page.getByLabel('New password').fill('tuesday-piano-at-four');
    await page.getByLabel('The same password again').fill('tuesday-piano-at-four');
    await screenshot(page, 'classes-import-5-welcome');
    await page.getByRole('button', { name: 'Save my password' }).click();
    await page.getByText('Your password is set.', { exact: false }).waitFor();
    await page.getByRole('link', { name: 'Go to sign-in' }).click();
    await signIn(page, 'saoirse.lambourne@mail.example', 'tuesday-piano-at-four');
    expect(s.problems).toEqual([]);
  });
});
