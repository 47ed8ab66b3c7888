import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ClassRow, SittingView, SlotView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const SITTING = '5a1f0000-0000-4000-8000-000000000001';
const teacher = makeUser(['teacher']);

function slot(
  n: number,
  name: string,
  start: string,
  end: string,
  over: Partial<SlotView> = {},
): SlotView {
  return {
    id: `5a1f0000-0000-4000-8000-00000000010${n}`,
    sittingId: SITTING,
    position: n,
    studentId: `5a1f0000-0000-4000-8000-00000000020${n}`,
    candidate: { name, pupilNumber: `KL10${n}`, grade: 3 },
    paperId: 'p1',
    startsAt: `2026-12-08T${start}:00.000Z`,
    endsAt: `2026-12-08T${end}:00.000Z`,
    startTime: start,
    endTime: end,
    minutes: 10,
    notBefore: null,
    examiner: { id: 'e1', displayName: 'Priya Halvorsen' },
    secondExaminer: null,
    outcome: null,
    outcomeNote: null,
    outcomeRecordedAt: null,
    resitOfSlotId: null,
    ownPupilAcknowledged: null,
    lengthened: false,
    ...over,
  };
}

function sitting(over: Partial<SittingView> = {}): SittingView {
  return {
    id: SITTING,
    title: 'Grade 3 mock',
    date: '2026-12-08',
    room: 'Studio 1',
    status: 'draft',
    timeZone: 'Europe/London',
    dayStart: '09:00',
    dayEnd: '12:00',
    candidateCount: 2,
    examiners: [{ id: 'e1', displayName: 'Priya Halvorsen' }],
    plannedBy: { id: 'm1', displayName: 'Rowan Hale' },
    breaks: [{ start: '10:30', end: '10:45', label: 'Coffee' }],
    writeUpGapMinutes: 3,
    changeoverMinutes: 0,
    papers: [
      {
        id: 'p1',
        listVersionId: 'l1',
        listId: 'L',
        name: 'Grade 3 technique',
        grade: '3',
        version: 1,
        suggestedMinutes: 10,
        slotMinutes: null,
        effectiveMinutes: 10,
      },
    ],
    slots: [
      slot(0, 'Kaia Gorsedd', '09:00', '09:15', {
        minutes: 15,
        lengthened: true,
        arrangement: {
          studentId: 's',
          extraTimePercent: 50,
          restBreakMinutes: 0,
          substitutions: [{ type: 'hands_separately' }],
          notes: null,
          updatedAt: null,
          updatedBy: null,
        },
      }),
      slot(1, 'Mira Gadsby', '09:15', '09:25'),
    ],
    pinned: null,
    permissions: { edit: true, recordOutcomes: false, changeStatus: ['scheduled'] },
    recordedExam: false,
    ...over,
  };
}

const classes: ClassRow[] = [
  {
    id: 'c1',
    name: 'Wednesday Intermediates',
    code: 'WED-INT',
    grade: null,
    active: true,
    teachers: [],
    memberCount: 10,
  },
];

describe('Sitting page', () => {
  it('shows the day in order with the lengthened slot and its arrangement', async () => {
    mockApi({ [`GET /api/sittings/${SITTING}`]: () => json(200, sitting()) });
    renderApp(`/sittings/${SITTING}`, makeSession(teacher));
    expect(
      await screen.findByRole('heading', { name: /Grade 3 mock/, level: 1 }),
    ).toBeInTheDocument();
    const rows = within(within(screen.getByRole('region', { name: /^Slots/ })).getByRole('table'))
      .getAllByRole('row')
      .slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell')[0]!.textContent)).toEqual([
      '09:00–09:15',
      '09:15–09:25',
    ]);
    expect(within(rows[0]!).getByText('Access arrangement')).toBeInTheDocument();
    expect(within(rows[0]!).getByText('50 % extra time, hands separately')).toBeInTheDocument();
    // the first slot cannot move earlier, the last not later
    expect(screen.getByRole('button', { name: 'Move Kaia Gorsedd earlier' })).toBeDisabled();
    expect(screen.getByRole('button', { name: 'Move Mira Gadsby later' })).toBeDisabled();
  });

  it('a refused move lists each conflict and changes nothing', async () => {
    const api = mockApi({
      [`GET /api/sittings/${SITTING}`]: () => json(200, sitting()),
      'POST /api/slots/5a1f0000-0000-4000-8000-000000000100/move': () =>
        apiError(
          409,
          'Kaia Gorsedd is already a candidate in "Grade 5 mock" (Recital Room, 2026-12-08) from 09:10 to 09:20; here the slot would be 09:10–09:25.',
          {
            details: {
              kind: 'conflicts',
              conflicts: [
                {
                  kind: 'candidate',
                  message:
                    'Kaia Gorsedd is already a candidate in "Grade 5 mock" (Recital Room, 2026-12-08) from 09:10 to 09:20; here the slot would be 09:10–09:25.',
                },
              ],
            },
          },
        ),
    });
    renderApp(`/sittings/${SITTING}`, makeSession(teacher));
    await userEvent.click(await screen.findByRole('button', { name: 'Move Kaia Gorsedd later' }));
    const alert = (await screen.findByText('Conflict: nothing was changed.')).closest(
      '[role="alert"]',
    ) as HTMLElement;
    expect(alert).toHaveTextContent('Conflict: nothing was changed.');
    expect(alert).toHaveTextContent('Kaia Gorsedd is already a candidate in "Grade 5 mock"');
    expect(api.calls('POST /api/slots/5a1f0000-0000-4000-8000-000000000100/move')[0]!.body).toEqual(
      { direction: 'later' },
    );
  });

  it('an examiner teaching a candidate must be acknowledged before the class is added', async () => {
    const api = mockApi({
      [`GET /api/sittings/${SITTING}`]: () => json(200, sitting()),
      'GET /api/classes': () => json(200, classes),
      [`POST /api/sittings/${SITTING}/candidates`]: (req) =>
        (req.body as { acknowledgeOwnPupil?: boolean }).acknowledgeOwnPupil
          ? json(200, { ...sitting(), added: 5, skipped: [] })
          : apiError(
              409,
              'Beatrix Oduya teaches Kaia Gorsedd (Wednesday Intermediates) and would mark their slot.',
              {
                details: {
                  kind: 'own_pupil',
                  warnings: [
                    {
                      slotId: 'x',
                      examinerIds: ['e2'],
                      message:
                        'Beatrix Oduya teaches Kaia Gorsedd (Wednesday Intermediates) and would mark their slot.',
                    },
                  ],
                },
              },
            ),
    });
    renderApp(`/sittings/${SITTING}`, makeSession(teacher));
    await userEvent.click(await screen.findByRole('button', { name: 'Add candidates' }));
    const dialog = await screen.findByRole('dialog', { name: 'Add candidates from a class' });
    const user = userEvent.setup();
    // PrimeReact's Dropdown opens on a click on its visible box; jsdom leaves the panel hidden.
    await waitFor(() =>
      expect(within(dialog).getByLabelText('Class').closest('.p-dropdown')).not.toBeNull(),
    );
    await user.click(within(dialog).getByLabelText('Class').closest('.p-dropdown') as HTMLElement);
    await user.click(
      await screen.findByRole('option', { name: 'Wednesday Intermediates (10)', hidden: true }),
    );
    await userEvent.click(within(dialog).getByRole('button', { name: 'Add candidates' }));
    const confirm = await screen.findByRole('dialog', {
      name: 'An examiner would mark their own pupil',
    });
    expect(confirm).toHaveTextContent(
      'Beatrix Oduya teaches Kaia Gorsedd (Wednesday Intermediates)',
    );
    await userEvent.click(
      within(confirm).getByRole('button', { name: 'Acknowledge and go ahead' }),
    );
    await waitFor(() =>
      expect(api.calls(`POST /api/sittings/${SITTING}/candidates`)).toHaveLength(2),
    );
    expect(api.calls(`POST /api/sittings/${SITTING}/candidates`).map((c) => c.body)).toEqual([
      { classId: 'c1' },
      { classId: 'c1', acknowledgeOwnPupil: true },
    ]);
  });

  it('a student sees only their own slot, with no planning controls', async () => {
    const own = sitting({
      papers: [],
      examiners: [],
      plannedBy: null,
      slots: [slot(0, 'Ellis Northcott', '09:30', '09:39', { examiner: null })],
      permissions: { edit: false, recordOutcomes: false, changeStatus: [] },
      status: 'scheduled',
    });
    mockApi({ [`GET /api/sittings/${SITTING}`]: () => json(200, own) });
    renderApp(`/sittings/${SITTING}`, makeSession(makeUser(['student'])));
    expect(await screen.findByRole('heading', { name: 'Your slot' })).toBeInTheDocument();
    expect(screen.getByRole('cell', { name: '09:30–09:39' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Add candidates' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Move/ })).toBeNull();
  });
});
