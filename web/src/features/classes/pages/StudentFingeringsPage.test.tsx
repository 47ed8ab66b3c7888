import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ClassDetail, CurrentFingering, StudentRow } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const CLASS_ID = '7a0c2f10-1111-4c1a-9b7e-0a1b2c3d4e01';
const STUDENT_ID = '7a0c2f10-2222-4c1a-9b7e-0a1b2c3d4e02';
const PATH = `/classes/${CLASS_ID}/students/${STUDENT_ID}/fingerings`;

const student: StudentRow = {
  id: STUDENT_ID,
  pupilNumber: 'LF2041',
  givenName: 'Marnie',
  familyName: 'Ostrander',
  email: null,
  dateOfBirth: '2014-03-02',
  grade: 3,
  active: true,
  hasSignIn: false,
  guardians: [],
  classCodes: ['TUE-G3'],
};
const cls: ClassDetail = {
  id: CLASS_ID,
  name: 'Tuesday Grade 3',
  code: 'TUE-G3',
  active: true,
  teachers: [],
  memberCount: 1,
  members: [student],
} as unknown as ClassDetail;

// C major, one octave, right hand: 1-2-3-1-2-3-4-5 up (common practice, from memory); up and
// down repeats the descent without the top note: 15 fingers (design.md §4.2: 2·8−1).
const upDown = [1, 2, 3, 1, 2, 3, 4, 5, 4, 3, 2, 1, 3, 2, 1];
const current: CurrentFingering = {
  id: 'f2',
  studentId: STUDENT_ID,
  kind: 'scale',
  key: 'C',
  mode: 'major',
  hand: 'RH',
  inversion: null,
  octaves: 1,
  direction: 'up_down',
  digits: upDown,
  note: 'Thumb under on F both ways.',
  revision: 2,
  setBy: { id: 'p1', displayName: 'Ada Quill' },
  setAt: '2026-11-20T10:00:00.000Z',
  history: [
    {
      id: 'f1',
      studentId: STUDENT_ID,
      kind: 'scale',
      key: 'C',
      mode: 'major',
      hand: 'RH',
      inversion: null,
      octaves: 1,
      direction: 'up',
      digits: [1, 2, 3, 1, 2, 3, 4, 5],
      note: null,
      revision: 1,
      setBy: { id: 'p1', displayName: 'Ada Quill' },
      setAt: '2026-10-01T10:00:00.000Z',
    },
  ],
};

const routes = (fingerings: CurrentFingering[] = [current]) => ({
  [`GET /api/classes/${CLASS_ID}`]: () => json(200, cls),
  [`GET /api/students/${STUDENT_ID}/fingerings`]: () => json(200, fingerings),
});

async function openDropdown(label: string) {
  const user = userEvent.setup();
  // PrimeReact's Dropdown opens on a click on its visible box; jsdom leaves the panel hidden.
  await user.click(screen.getByLabelText(label).closest('.p-dropdown') as HTMLElement);
  return user;
}

// Lazy page chunks and PrimeReact load slowly on a shared 2-core machine.
const SLOW = 60_000;

describe('a student’s approved fingerings', () => {
  it(
    'opens from the class’s members table',
    async () => {
      mockApi({ ...routes(), 'GET /api/classes': () => json(200, [cls]) });
      const { router } = renderApp(`/classes/${CLASS_ID}`, makeSession(makeUser(['teacher'])));
      await userEvent.click(
        await screen.findByRole('button', { name: 'Fingerings of Marnie Ostrander' }),
      );
      expect(
        await screen.findByRole('heading', { name: 'Approved fingerings: Marnie Ostrander' }),
      ).toBeInTheDocument();
      expect(router.state.location.pathname).toBe(PATH);
      expect(screen.getByRole('link', { name: 'Tuesday Grade 3' })).toHaveAttribute(
        'href',
        `/classes/${CLASS_ID}`,
      );
    },
    SLOW,
  );

  it(
    'shows the current fingering per request, with its history on demand',
    async () => {
      mockApi(routes());
      renderApp(PATH, makeSession(makeUser(['teacher'])));
      expect(
        await screen.findByRole('heading', { name: 'Approved fingerings: Marnie Ostrander' }),
      ).toBeInTheDocument();
      const table = await screen.findByRole('table', { name: 'Approved fingerings' });
      const row = await within(table).findByRole('row', { name: /C major scale/ });
      expect(within(row).getByText('1-2-3-1-2-3-4-5-4-3-2-1-3-2-1')).toBeInTheDocument();
      expect(within(row).getByText('1 octave, up and down')).toBeInTheDocument();
      expect(within(row).getByText('Revision 2')).toBeInTheDocument();
      expect(within(row).getByText('Thumb under on F both ways.')).toBeInTheDocument();

      await userEvent.click(
        within(row).getByRole('button', {
          name: 'Show earlier fingerings: C major scale, right hand',
        }),
      );
      const history = await screen.findByRole('table', {
        name: 'Earlier fingerings: C major scale, right hand',
      });
      expect(within(history).getByText('1-2-3-1-2-3-4-5')).toBeInTheDocument();
      expect(within(history).getByText('1 octave, up only')).toBeInTheDocument();
    },
    SLOW,
  );

  it(
    'checks the fingering live against the note count of the chosen span',
    async () => {
      mockApi(routes([]));
      renderApp(PATH, makeSession(makeUser(['teacher'])));
      await userEvent.click(await screen.findByRole('button', { name: 'Record a fingering' }));
      const form = await screen.findByRole('form', {
        name: 'Record a fingering for Marnie Ostrander',
      });
      // One octave up and down: 15 notes (design.md §4.2, worked by hand: 2·(7+1)−1).
      expect(
        within(form).getByText(/C major scale, 1 octave up and down: 15 notes, one finger each/),
      ).toBeInTheDocument();
      const digits = within(form).getByLabelText('Fingering');
      await userEvent.type(digits, '1 2 3 1 2 3 4 5');
      expect(
        await within(form).findByText(
          'Too few fingers: 8 given, 15 notes (missing from position 9).',
        ),
      ).toBeInTheDocument();

      // Up only: 8 notes, so the same fingers are now right.
      await userEvent.click(within(form).getByLabelText('Up only'));
      await waitFor(() =>
        expect(within(form).queryByText(/Too few fingers/)).not.toBeInTheDocument(),
      );
      expect(within(form).getByText(/1 octave up only: 8 notes.*; 8 typed\./)).toBeInTheDocument();

      await userEvent.clear(digits);
      await userEvent.type(digits, '1-2-3-1-2-6-4-5');
      expect(
        await within(form).findByText('Position 6: "6" is not a finger; use 1 (thumb) to 5.'),
      ).toBeInTheDocument();
      await userEvent.clear(digits);
      await userEvent.type(digits, '1 2 x');
      expect(
        await within(form).findByText('Position 3: "x" is not a single finger digit.'),
      ).toBeInTheDocument();
    },
    SLOW,
  );

  it(
    'sends the shared body, and shows the API’s refusal beside the field it names',
    async () => {
      let posts = 0;
      const api = mockApi({
        ...routes([]),
        [`POST /api/students/${STUDENT_ID}/fingerings`]: () => {
          posts += 1;
          return posts === 1
            ? apiError(400, 'key: Not a key or note name (e.g. "F#", "Bb").', {
                details: [{ path: 'key', message: 'Not a key or note name (e.g. "F#", "Bb").' }],
              })
            : json(201, { ...current, history: [], revision: 1, id: 'f9', hand: 'LH' });
        },
      });
      renderApp(PATH, makeSession(makeUser(['teacher'])));
      await userEvent.click(await screen.findByRole('button', { name: 'Record a fingering' }));
      const form = await screen.findByRole('form', { name: /Record a fingering/ });
      await userEvent.click(within(form).getByLabelText('Left hand'));
      await openDropdown('Octaves').then(async (user) =>
        user.click(await screen.findByRole('option', { name: '2 octaves', hidden: true })),
      );
      // C major, two octaves up, left hand: 5-4-3-2-1-3-2-1-4-3-2-1-3-2-1 (common practice, from
      // memory); 2·7+1 = 15 notes one way.
      await userEvent.click(within(form).getByLabelText('Up only'));
      await userEvent.type(within(form).getByLabelText('Fingering'), '543213214321321');
      await userEvent.type(within(form).getByLabelText(/Note for the student/), ' Crossing on F. ');
      await userEvent.click(within(form).getByRole('button', { name: 'Save fingering' }));

      expect(
        await within(form).findByText('Not a key or note name (e.g. "F#", "Bb").'),
      ).toBeInTheDocument();
      expect(api.calls(`POST /api/students/${STUDENT_ID}/fingerings`)[0]?.body).toEqual({
        kind: 'scale',
        key: 'C',
        mode: 'major',
        hand: 'LH',
        inversion: null,
        octaves: 2,
        direction: 'up',
        digits: [5, 4, 3, 2, 1, 3, 2, 1, 4, 3, 2, 1, 3, 2, 1],
        note: 'Crossing on F.',
      });
      // Nothing typed was lost: a second try sends it again and closes the form.
      await userEvent.click(within(form).getByRole('button', { name: 'Save fingering' }));
      await waitFor(() => expect(screen.queryByRole('form')).not.toBeInTheDocument());
      expect(api.calls(`GET /api/students/${STUDENT_ID}/fingerings`).length).toBeGreaterThan(1);
    },
    SLOW,
  );

  it(
    'replaces a fingering from its row, starting from what it is now',
    async () => {
      mockApi(routes());
      renderApp(PATH, makeSession(makeUser(['admin'])));
      await userEvent.click(
        await screen.findByRole('button', {
          name: 'Replace the fingering: C major scale, right hand',
        }),
      );
      const form = await screen.findByRole('form', {
        name: 'Replace the fingering: C major scale',
      });
      expect(within(form).getByLabelText('Fingering')).toHaveValue('1-2-3-1-2-3-4-5-4-3-2-1-3-2-1');
      expect(within(form).getByLabelText('Right hand')).toBeChecked();
      // A chromatic scale has no mode: the field goes, and the key becomes a starting note.
      const user = await openDropdown('Kind');
      await user.click(
        await screen.findByRole('option', { name: 'Chromatic scale', hidden: true }),
      );
      expect(within(form).queryByLabelText('Mode')).not.toBeInTheDocument();
      expect(within(form).getByLabelText('Starting note')).toBeInTheDocument();
      // 12·1+1 = 13 one way, 25 up and down (design.md §4.2): the 15 fingers no longer fit.
      expect(
        await within(form).findByText(
          'Too few fingers: 15 given, 25 notes (missing from position 16).',
        ),
      ).toBeInTheDocument();
    },
    SLOW,
  );

  it(
    'says so when the fingerings cannot be shown to this person',
    async () => {
      mockApi({
        [`GET /api/classes/${CLASS_ID}`]: () => json(200, cls),
        [`GET /api/students/${STUDENT_ID}/fingerings`]: () => apiError(404, 'No such student.'),
      });
      renderApp(PATH, makeSession(makeUser(['teacher'])));
      expect(
        await screen.findByText(
          /Could not load the fingerings of Marnie Ostrander\. No such student\./,
        ),
      ).toBeInTheDocument();
    },
    SLOW,
  );
});
