import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { BASE_URL, launch, screenshot, type Session } from './support/browser';
import { DEMO, DEMO_PASSWORD, navLink, signIn } from './support/sign-in';

/** A unique name per run, so the journey can run against a database that has seen it before. */
const stamp = new Date().toISOString().slice(11, 19).replace(/:/g, '');
const RUBRIC = `Scales check ${stamp}`;
const LIST = `Grade 3 mock ${stamp}`;

/** The n-th criterion (0-based) of the rubric form. */
const criterion = (page: Page, n: number) => page.locator('li.sm-criterion').nth(n);
const line = (page: Page, n: number) => page.locator('li.sm-line').nth(n);
/** A version's status tag (the version picker holds the same words in hidden options). */
const tag = (page: Page, text: string) => page.locator('.p-tag', { hasText: text }).first();

async function fillCriterion(
  c: Locator,
  label: string,
  weight: string,
  maxMark: string,
  levels: string[],
) {
  await c.getByLabel('Label', { exact: true }).fill(label);
  await c.getByLabel('Label', { exact: true }).blur(); // suggests the key from the label
  await c.getByLabel('Weight', { exact: true }).fill(weight);
  await c.getByLabel('Maximum mark').fill(maxMark);
  await c.getByRole('button', { name: 'Spread levels over 0 to the maximum' }).click();
  const texts = c.getByLabel(/level \d+: descriptor$/);
  for (let i = 0; i < levels.length; i++) await texts.nth(i).fill(levels[i]!);
}

/** Ticks options of a PrimeReact MultiSelect inside `scope`, then closes its panel. */
async function pickFromMultiSelect(page: Page, scope: Locator, label: string, options: string[]) {
  await scope.locator('.p-multiselect', { has: page.getByLabel(label, { exact: true }) }).click();
  const panel = page.locator('.p-multiselect-panel');
  for (const o of options) await panel.getByRole('option', { name: o, exact: true }).click();
  await page.keyboard.press('Escape');
  await panel.waitFor({ state: 'hidden' });
}

/** Chooses an option of a PrimeReact Dropdown inside `scope`. */
async function pickFromDropdown(
  page: Page,
  scope: Locator,
  label: string,
  option: string | RegExp,
) {
  await scope.locator('.p-dropdown', { has: page.getByLabel(label, { exact: true }) }).click();
  await page
    .locator('.p-dropdown-panel')
    .getByRole('option', { name: option, exact: true })
    .click();
}

describe('a teacher writes a rubric and a requirement list', () => {
  let s: Session;
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('creates, publishes and edits a rubric; builds a grade list with live timings and a sample draw', async () => {
    const page = s.page;
    await signIn(page, DEMO.teacher);

    // The starter library is there from the seed.
    await navLink(page, 'Rubrics').click();
    await page.getByRole('heading', { name: 'Rubrics', level: 1 }).waitFor();
    await page.getByRole('link', { name: 'Scales and chromatic scales' }).waitFor();
    await screenshot(page, 'rubrics-list');

    // A new rubric with three criteria.
    await page.getByRole('button', { name: 'New rubric' }).click();
    await page.getByRole('heading', { name: 'New rubric', level: 1 }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill(RUBRIC);
    await page.getByLabel('Scales', { exact: true }).check();
    await fillCriterion(criterion(page, 0), 'Note accuracy', '3', '10', [
      'Many wrong notes.',
      'Some slips, recovered.',
      'Secure throughout.',
    ]);
    await page.getByRole('button', { name: 'Add a criterion' }).click();
    await fillCriterion(criterion(page, 1), 'Evenness', '2', '5', [
      'Uneven.',
      'Mostly even.',
      'Even throughout.',
    ]);
    await page.getByRole('button', { name: 'Add a criterion' }).click();
    await fillCriterion(criterion(page, 2), 'Freedom from tension', '1', '5', [
      'Tension stays.',
      'Brief tightening.',
      'Free throughout.',
    ]);
    // The key follows the label; the weight share is computed as the teacher types (3 of 6 = 50 %).
    expect(await criterion(page, 0).getByLabel('Key').inputValue()).toBe('note_accuracy');
    await criterion(page, 0).getByText('Share of the request’s score: 50 %').waitFor();
    // The tension criterion carries the health caution.
    await criterion(page, 2)
      .getByRole('note')
      .getByText(/seek advice from a qualified health professional/)
      .waitFor();
    await screenshot(page, 'rubric-new-form');

    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByRole('heading', { name: RUBRIC, level: 1 }).waitFor();
    await tag(page, 'Version 1 · draft').waitFor();

    // Publish: a confirmation first.
    await page.getByRole('button', { name: 'Publish' }).click();
    await page
      .getByRole('dialog', { name: 'Publish version 1?' })
      .getByRole('button', { name: 'Publish' })
      .click();
    await tag(page, 'Version 1 · published').waitFor();
    await screenshot(page, 'rubric-published-v1');

    // Edit: version 2 appears as a draft; version 1 stays as it was.
    await page.getByRole('button', { name: 'Edit as a new version' }).click();
    await page.getByText('Version 1 is published and stays exactly as it is.').waitFor();
    await criterion(page, 1).getByLabel('Weight', { exact: true }).fill('4');
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    await tag(page, 'Version 2 · draft').waitFor();
    const evenness = page.locator('li.sm-criterion', { hasText: 'Evenness' });
    await evenness.getByText('4 (50 %)').waitFor();
    await screenshot(page, 'rubric-draft-v2');
    await pickFromDropdown(page, page.locator('main'), 'Version', 'Version 1 · published');
    await page.getByText('You are looking at version 1. The latest is version 2').waitFor();
    await evenness.getByText('2 (33 %)').waitFor();
    await screenshot(page, 'rubric-v1-unchanged');

    // Export version 1 as a file, and import the file back: a new rubric, a draft.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Export' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`scales-check-${stamp}-v1.rubric.json`);
    const file = join(
      mkdtempSync(join(tmpdir(), 'stavemark-rubric-')),
      download.suggestedFilename(),
    );
    await download.saveAs(file);
    const exported = JSON.parse(readFileSync(file, 'utf8')) as {
      format: string;
      rubric: { criteria: { key: string; weight: number }[] };
    };
    expect(exported.format).toBe('stavemark.rubric');
    expect(exported.rubric.criteria.map((c) => `${c.key}:${c.weight}`)).toEqual([
      'note_accuracy:3',
      'evenness:2',
      'freedom_from_tension:1',
    ]);
    await navLink(page, 'Rubrics').click();
    await page.getByLabel('Rubric file to import').setInputFiles(file);
    await page.getByText(`“${RUBRIC}” was imported as a draft.`).waitFor();
    await tag(page, 'Version 1 · draft').waitFor();
    // A file that is not a rubric is refused, saying where.
    writeFileSync(
      file,
      JSON.stringify({
        ...exported,
        rubric: { ...exported.rubric, criteria: [{ ...exported.rubric.criteria[0], weight: 0 }] },
      }),
    );
    await navLink(page, 'Rubrics').click();
    await page.getByLabel('Rubric file to import').setInputFiles(file);
    await page
      .getByRole('alert')
      .getByText('rubric.criteria.0.weight: Weight must be greater than 0.', { exact: false })
      .waitFor();
    await screenshot(page, 'rubric-import-refused');

    // A requirement list for grade 3 with a scale line and an arpeggio line.
    await navLink(page, 'Requirement lists').click();
    await page.getByRole('heading', { name: 'Requirement lists', level: 1 }).waitFor();
    await page.getByRole('button', { name: 'New requirement list' }).click();
    await page.getByRole('heading', { name: 'New requirement list', level: 1 }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill(LIST);
    await page.getByLabel('Grade', { exact: true }).fill('3');
    await page.getByLabel('Requests asked').fill('3');

    const scale = line(page, 0);
    await pickFromMultiSelect(page, scale, 'Keys', ['D', 'B♭']);
    await scale.getByLabel('harmonic minor').check();
    await scale.getByLabel('right hand').uncheck();
    await scale.getByLabel('left hand').uncheck();
    await scale.getByLabel('hands together').check();
    await scale.getByLabel('1', { exact: true }).uncheck();
    await scale.getByLabel('2', { exact: true }).check();
    await scale.getByLabel('Beats per minute').fill('80');
    await scale.getByLabel('Notes per beat').fill('4');
    await pickFromDropdown(page, scale, 'Marked with', `${RUBRIC} · version 1`);
    // Two octaves up and down: 2·(7·2+1)−1 = 29 notes; 80 × 4 / 60 = 5.33 notes a second; 29 / 5.33 = 5.4 s.
    const scaleTiming = scale.getByRole('table', { name: /^Timing of/ });
    await scaleTiming
      .getByRole('row', { name: /2 octaves, up and down 29 5\.33 5\.4 s/ })
      .waitFor();
    await scale.getByText('crotchet = 80, semiquavers').waitFor();

    await page.getByRole('button', { name: 'Add an arpeggio line' }).click();
    const arpeggio = line(page, 1);
    await pickFromMultiSelect(page, arpeggio, 'Keys', ['C', 'G']);
    await arpeggio.getByLabel('1', { exact: true }).uncheck();
    await arpeggio.getByLabel('2', { exact: true }).check();
    // Two octaves of a triad up and down: 2·(3·2+1)−1 = 13 notes; 60 × 2 / 60 = 2 a second; 6.5 s.
    await arpeggio
      .getByRole('table', { name: /^Timing of/ })
      .getByRole('row', { name: /2 octaves, up and down 13 2\.00 6\.5 s/ })
      .waitFor();
    await page.getByLabel('At least, arpeggios').fill('1');

    // The sample draw follows the rule: three requests, at least one scale and one arpeggio.
    const draw = page.getByRole('table', { name: 'Sample draw' });
    await expect.poll(() => draw.locator('tbody tr').count()).toBe(3);
    const drawn = (await draw.locator('tbody tr').allTextContents()).join('\n');
    expect(drawn).toMatch(/scale/);
    expect(drawn).toMatch(/arpeggio/);
    await screenshot(page, 'requirement-list-form');

    // A new seed gives a draw of its own; the same seed gives the same draw again.
    await page.getByLabel('Seed').fill('lesson-12');
    const first = await draw.locator('tbody').textContent();
    await page.getByLabel('Seed').fill('lesson-13');
    await page.getByLabel('Seed').fill('lesson-12');
    expect(await draw.locator('tbody').textContent()).toBe(first);

    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByRole('heading', { name: LIST, level: 1 }).waitFor();
    const lines = page.getByRole('table', { name: 'Lines' });
    await lines.getByRole('row', { name: /29/ }).waitFor();
    await lines.getByText('5.4 s').waitFor();
    await lines.getByText('6.5 s').waitFor();
    await page.getByRole('table', { name: 'Sample draw' }).waitFor();
    await screenshot(page, 'requirement-list-saved');

    // The starter library: the demo school has every entry already, each with a way to it.
    await navLink(page, 'Requirement lists').click();
    await page.getByRole('button', { name: 'Add from the starter library' }).click();
    const starter = page.getByRole('dialog', { name: 'Add from the starter library' });
    const grade1 = starter.getByRole('listitem', { name: 'Grade 1 technique' });
    await grade1.getByText('In your school').waitFor();
    await grade1.getByRole('link', { name: 'Open' }).waitFor();
    await screenshot(page, 'starter-library-lists');
    await page.keyboard.press('Escape');
    await starter.waitFor({ state: 'hidden' });
    expect(s.problems).toEqual([]);
  });

  it('records a student’s approved fingering from the class list and sees it on the list', async () => {
    const page = s.page;
    await signIn(page, DEMO.teacher);
    await navLink(page, 'Classes').click();
    await page.getByRole('link', { name: /Monday Foundations/ }).click();
    await page.getByRole('heading', { name: 'Monday Foundations', level: 1 }).waitFor();
    await page.getByRole('button', { name: 'Fingerings of Ada Pendry' }).click();
    await page
      .getByRole('heading', { name: 'Approved fingerings: Ada Pendry', level: 1 })
      .waitFor();

    await page.getByRole('button', { name: 'Record a fingering' }).click();
    const form = page.getByRole('form', { name: 'Record a fingering for Ada Pendry' });
    await pickFromDropdown(page, form, 'Key', 'G');
    // One octave up and down: 2·(7·1+1)−1 = 15 notes (design.md §4.2, worked by hand).
    await form.getByText(/G major scale, 1 octave up and down: 15 notes/).waitFor();
    const fingers = form.getByLabel('Fingering', { exact: true });
    await fingers.fill('1 2 3 1 2 3 4 5');
    await form.getByText('Too few fingers: 8 given, 15 notes (missing from position 9).').waitFor();
    await screenshot(page, 'fingering-form-too-few');
    // G major, right hand, one octave up and down: 1-2-3-1-2-3-4-5-4-3-2-1-3-2-1 (common
    // practice, from memory).
    await fingers.fill('1-2-3-1-2-3-4-5-4-3-2-1-3-2-1');
    await form.getByText(/; 15 typed\./).waitFor();
    await form.getByLabel(/Note for the student/).fill('Thumb under after B on the way up.');
    await form.getByRole('button', { name: 'Save fingering' }).click();
    await form.waitFor({ state: 'hidden' });

    const table = page.getByRole('table', { name: 'Approved fingerings' });
    const row = table.getByRole('row').filter({ hasText: 'G major scale' });
    await row.getByText('1-2-3-1-2-3-4-5-4-3-2-1-3-2-1').waitFor();
    await row.getByText('1 octave, up and down').waitFor();
    await row.getByText('Thumb under after B on the way up.').waitFor();
    await screenshot(page, 'fingerings-list');

    // Replace it with the way up only: a new revision; the earlier one stays as history.
    await row
      .getByRole('button', { name: 'Replace the fingering: G major scale, right hand' })
      .click();
    const replace = page.getByRole('form', { name: 'Replace the fingering: G major scale' });
    await replace.getByLabel('Up only').check();
    await replace
      .getByText('Too many fingers: 15 given, 8 notes (surplus from position 9).')
      .waitFor();
    await replace.getByLabel('Fingering', { exact: true }).fill('12312345');
    await replace.getByRole('button', { name: 'Save fingering' }).click();
    await replace.waitFor({ state: 'hidden' });
    await row.getByText('1-2-3-1-2-3-4-5', { exact: true }).waitFor();
    await row
      .getByRole('button', { name: 'Show earlier fingerings: G major scale, right hand' })
      .click();
    const history = page.getByRole('table', {
      name: 'Earlier fingerings: G major scale, right hand',
    });
    await history.getByText('1-2-3-1-2-3-4-5-4-3-2-1-3-2-1').first().waitFor();
    await screenshot(page, 'fingerings-history');

    // The API holds the same (read with a sign-in of its own): the current one is the last saved.
    const studentId = /students\/([^/]+)\/fingerings/.exec(page.url())![1]!;
    const login = await fetch(`${BASE_URL}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: DEMO.teacher, password: DEMO_PASSWORD }),
    });
    const { accessToken } = (await login.json()) as { accessToken: string };
    const res = await fetch(`${BASE_URL}/api/students/${studentId}/fingerings`, {
      headers: { Authorization: `Bearer ${accessToken}` },
    });
    expect(res.status).toBe(200);
    const current = (await res.json()) as { key: string; digits: number[]; direction: string }[];
    expect(current.find((f) => f.key === 'G')).toMatchObject({
      direction: 'up',
      digits: [1, 2, 3, 1, 2, 3, 4, 5],
    });
    expect(s.problems).toEqual([]);
  });
});
