import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { launch, screenshot, type Session } from './support/browser';
import { DEMO, navLink, signIn } from './support/sign-in';

/** A PCM WAV made here (our own): RIFF header, 8 kHz mono 16-bit, a rising tone so it is audible. */
function wav(seconds: number): Buffer {
  const rate = 8000;
  const n = seconds * rate;
  const b = Buffer.alloc(44 + n * 2);
  b.write('RIFF', 0, 'latin1');
  b.writeUInt32LE(36 + n * 2, 4);
  b.write('WAVEfmt ', 8, 'latin1');
  b.writeUInt32LE(16, 16);
  b.writeUInt16LE(1, 20);
  b.writeUInt16LE(1, 22);
  b.writeUInt32LE(rate, 24);
  b.writeUInt32LE(rate * 2, 28);
  b.writeUInt16LE(2, 32);
  b.writeUInt16LE(16, 34);
  b.write('data', 36, 'latin1');
  b.writeUInt32LE(n * 2, 40);
  for (let i = 0; i < n; i++) b.writeInt16LE(Math.round(Math.sin((2 * Math.PI * (220 + i / 400) * i) / rate) * 9000), 44 + i * 2);
  return b;
}

// Issue 6 §6 on the demo school: a teacher adds a recording to a pupil's slot in today's sitting;
// the examiner plays it on the marking desk, seeks in it (HTTP Range), and the desk's flag keys
// still work with the player focused. Wren Ashdown (13) has a guardian's consent on record.
const CANDIDATE = 'Wren Ashdown';

describe('a recording of a slot, from upload to the marking desk', () => {
  let s: Session;
  let work: string;
  beforeAll(() => {
    work = mkdtempSync(join(tmpdir(), 'stavemark-recording-'));
  });
  afterAll(() => rmSync(work, { recursive: true, force: true }));
  beforeEach(async () => {
    s = await launch();
  });
  afterEach(async () => {
    await s?.close();
  });

  it('the teacher uploads; a text file named .mp3 is refused; the examiner plays and seeks on the desk', async () => {
    const { page } = s;
    const take = join(work, 'wren-scales.wav');
    writeFileSync(take, wav(20));
    const fake = join(work, 'not-audio.mp3');
    writeFileSync(fake, 'These are practice notes, not a recording.\n'.repeat(50));

    // 1. The teacher, on the sitting page.
    await signIn(page, DEMO.teacher);
    await navLink(page, 'Sittings').click();
    await page.getByRole('link', { name: 'Grade 5 mock — Thursday Seniors' }).click();
    const section = page.getByRole('region', { name: 'Recordings' });
    await section.waitFor();
    await section.getByRole('button', { name: new RegExp(CANDIDATE) }).click();
    const panel = section.getByRole('region', { name: `Recordings of ${CANDIDATE}` });
    await panel.getByText('No recording yet.').waitFor();

    await panel.getByLabel(new RegExp(`Add a recording of ${CANDIDATE}`)).setInputFiles(fake);
    await panel.getByRole('button', { name: 'Upload' }).click();
    await panel.getByText('whatever its name says', { exact: false }).waitFor();
    await screenshot(page, 'recordings-1-refused-by-content');

    await panel.getByLabel(new RegExp(`Add a recording of ${CANDIDATE}`)).setInputFiles(take);
    await panel.getByRole('button', { name: 'Upload' }).click();
    await panel.getByText('The recording is saved.').waitFor();
    await panel.getByRole('button', { name: `Play recording 1 of ${CANDIDATE}` }).waitFor();
    expect(await panel.getByText('0:20', { exact: false }).count()).toBeGreaterThan(0);
    await screenshot(page, 'recordings-2-sitting-page');

    // 2. The examiner, at the desk.
    await s.close();
    s = await launch();
    const desk = s.page;
    const ranges: number[] = [];
    desk.on('response', (r) => {
      if (r.url().includes('/api/media/')) ranges.push(r.status());
    });
    await signIn(desk, DEMO.examiner);
    await navLink(desk, 'Marking').click();
    await desk.getByRole('heading', { name: 'Marking today', level: 1 }).waitFor();
    await desk.getByRole('link', { name: CANDIDATE }).first().click();
    await desk.getByRole('heading', { name: new RegExp(CANDIDATE) }).waitFor();
    const openSitting = desk.getByRole('button', { name: 'Start the sitting' });
    if (await openSitting.isVisible()) await openSitting.click();
    await desk.getByRole('button', { name: 'Start the slot' }).click();
    await desk.locator('#current-request').waitFor();

    const play = desk.getByRole('button', { name: `Play recording 1 of ${CANDIDATE}` });
    await play.click();
    await desk.getByRole('button', { name: `Pause recording 1 of ${CANDIDATE}` }).waitFor();
    const audio = desk.locator('.sm-player audio');
    await expect.poll(() => audio.evaluate((a: HTMLAudioElement) => a.currentTime), { timeout: 10_000 }).toBeGreaterThan(0.3);

    // Seek by keyboard on the bar: the server answers byte ranges (206).
    const bar = desk.getByRole('slider', { name: 'Position' });
    await bar.focus();
    for (let i = 0; i < 3; i++) await desk.keyboard.press('ArrowRight');
    await expect.poll(() => audio.evaluate((a: HTMLAudioElement) => a.currentTime)).toBeGreaterThan(14);
    expect(ranges).toContain(206);
    expect(ranges.every((st) => st === 206 || st === 200)).toBe(true);

    // The desk's flag key still counts with the player focused.
    await desk.getByRole('button', { name: `Pause recording 1 of ${CANDIDATE}` }).focus();
    await desk.keyboard.press('f');
    await expect.poll(() => desk.getByTestId('count-slip').textContent()).toBe('1');
    await desk.getByText('All changes saved').waitFor();
    await screenshot(desk, 'recordings-3-desk-playing');

    // The write-up keeps the player; a digit still marks the focused row.
    await desk.keyboard.press('w');
    const stops = desk.locator('[data-desk-stop]');
    await stops.first().waitFor();
    await stops.first().focus();
    await desk.keyboard.press('3');
    await expect.poll(() => desk.locator(':focus').getAttribute('data-cell')).not.toBe(await stops.first().getAttribute('data-cell'));
    await screenshot(desk, 'recordings-4-desk-write-up');
  });
});
