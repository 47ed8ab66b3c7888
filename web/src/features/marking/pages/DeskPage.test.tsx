import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { TENSION_CAUTION, type DeskView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const criterion = (key: string, label: string, maxMark = 5) => ({
  key,
  label,
  weight: 1,
  maxMark,
  tension: key === 'freedom_from_tension',
  descriptors: [
    { min: 0, max: 2, text: `${label}: not yet secure.` },
    { min: 3, max: maxMark, text: `${label}: secure.` },
  ],
});

function desk(): DeskView {
  return {
    slot: {
      id: 's1',
      sittingId: 'sit1',
      sittingTitle: 'Grade 5 mock',
      sittingStatus: 'in_progress',
      room: 'Recital Room',
      startsAt: new Date().toISOString(),
      endsAt: new Date(Date.now() + 15 * 60_000).toISOString(),
      minutes: 15,
      writeUpGapMinutes: 5,
      outcome: null,
      candidate: { name: 'Ellis Northcott', pupilNumber: 'KL1021', grade: 5 },
      listName: 'Grade 5 technique',
      extraTimePercent: 0,
    },
    role: 'first',
    noteNames: 'american',
    draw: {
      seed: 'abc',
      algorithm: 'mulberry32/fnv1a32 v1',
      drawnAt: new Date().toISOString(),
      repeatsOfPrevious: 0,
    },
    requests: [
      {
        index: 0,
        lineId: 'l1',
        kind: 'scale',
        key: 'D',
        mode: 'harmonic_minor',
        hands: 'HT',
        motion: 'similar',
        octaves: 2,
        direction: 'up_down',
        articulation: 'legato',
        dynamic: null,
        inversion: null,
        tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 2 },
        rubricVersionId: 'r1',
        difficultyWeight: 1,
        title: null,
        durationSeconds: null,
        substitution: null,
        criteria: [
          criterion('accuracy', 'Note accuracy'),
          criterion('freedom_from_tension', 'Freedom from tension'),
        ],
        rubricName: 'Scales',
        fingerings: [],
        change: null,
      },
    ],
    sheet: {
      id: 'sh1',
      slotId: 's1',
      examiner: { id: 'm1', displayName: 'Priya' },
      role: 'first',
      status: 'draft',
      startedAt: new Date().toISOString(),
      submittedAt: null,
      cells: [],
    },
    otherSheet: null,
  };
}

describe('the marking desk', () => {
  it('shows the request with the tempo in the person’s convention, and counts a flag per key press', async () => {
    const api = mockApi({
      'GET /api/slots/s1/desk': () => json(200, desk()),
      'POST /api/mark-sheets/sh1/cells': (req) => {
        const b = req.body as {
          cell: string;
          value: number;
          changeId: string;
          baseVersion: number;
        };
        return json(200, {
          status: 'applied',
          cell: b.cell,
          value: b.value,
          version: b.baseVersion + 1,
          changeId: b.changeId,
        });
      },
    });
    renderApp('/marking/slots/s1', makeSession(makeUser(['examiner'])));
    expect(
      await screen.findByRole('heading', { name: 'D harmonic minor scale' }),
    ).toBeInTheDocument();
    // Checked against design.md §9: American names when the person chose them (quarter = 80).
    expect(screen.getByText('quarter = 80')).toBeInTheDocument();
    fireEvent.keyDown(window, { key: 'f' });
    fireEvent.keyDown(window, { key: 'f' });
    await waitFor(() => expect(screen.getByTestId('count-slip')).toHaveTextContent('2'));
    await waitFor(() =>
      expect(screen.getByRole('status', { name: '' })).toHaveTextContent('All changes saved'),
    );
    const saves = api.requests
      .filter((r) => r.method === 'POST')
      .map((r) => r.body as { cell: string; value: number; baseVersion: number });
    expect(saves.map((s) => [s.cell, s.value, s.baseVersion])).toEqual([
      ['flag:0:slip', 1, 0],
      ['flag:0:slip', 2, 1],
    ]);
  });

  it('marks by digit in the write-up, moves on, shows the descriptor and the tension caution', async () => {
    const api = mockApi({
      'GET /api/slots/s1/desk': () => json(200, desk()),
      'POST /api/mark-sheets/sh1/cells': (req) => {
        const b = req.body as {
          cell: string;
          value: number;
          changeId: string;
          baseVersion: number;
        };
        return json(200, {
          status: 'applied',
          cell: b.cell,
          value: b.value,
          version: b.baseVersion + 1,
          changeId: b.changeId,
        });
      },
    });
    renderApp('/marking/slots/s1', makeSession(makeUser(['examiner'])));
    fireEvent.click(await screen.findByRole('tab', { name: 'Write-up' }));
    const first = screen.getByRole('group', { name: /Request 1, Note accuracy/ });
    first.focus();
    fireEvent.keyDown(first, { key: '4' });
    const second = screen.getByRole('group', { name: /Request 1, Freedom from tension/ });
    expect(second).toHaveFocus();
    expect(first.querySelector('.sm-desk-row__descriptor')).toHaveTextContent(
      'Note accuracy: secure.',
    );
    // A digit above the maximum is ignored and focus stays.
    fireEvent.keyDown(second, { key: '9' });
    expect(second).toHaveFocus();
    expect(screen.getByText(TENSION_CAUTION)).toBeInTheDocument();
    await waitFor(() =>
      expect(
        api.requests.some(
          (r) => r.method === 'POST' && (r.body as { cell: string }).cell === 'mark:0:accuracy',
        ),
      ).toBe(true),
    );
    expect(screen.getByRole('button', { name: 'Submit sheet' })).toBeInTheDocument();
  });

  it('plays the slot’s recording on the desk without taking the flag and digit keys', async () => {
    const saved = (req: { body: unknown }) => {
      const b = req.body as { cell: string; value: number; changeId: string; baseVersion: number };
      return json(200, { status: 'applied', cell: b.cell, value: b.value, version: b.baseVersion + 1, changeId: b.changeId });
    };
    mockApi({
      'GET /api/slots/s1/desk': () => json(200, desk()),
      'POST /api/mark-sheets/sh1/cells': saved,
      'GET /api/slots/s1/recordings': () =>
        json(200, {
          slotId: 's1',
          canUpload: false,
          uploadBlockedReason: null,
          recordedExam: false,
          maxBytes: 200 * 1024 * 1024,
          items: [
            {
              id: 'r1',
              purpose: 'slot',
              slotId: 's1',
              studentId: 'st1',
              contentType: 'audio/wav',
              kind: 'audio',
              sizeBytes: 32044,
              durationSeconds: 60,
              originalName: 'take.wav',
              uploadedBy: 'Idris Calloway',
              createdAt: new Date().toISOString(),
              expiresAt: new Date(Date.now() + 180 * 86_400_000).toISOString(),
              playbackUrl: '/api/media/a.b',
              playbackExpiresAt: new Date(Date.now() + 300_000).toISOString(),
              canDelete: false,
            },
          ],
        }),
    });
    renderApp('/marking/slots/s1', makeSession(makeUser(['examiner'])));
    const play = await screen.findByRole('button', { name: 'Play recording 1 of Ellis Northcott' });
    // The phase is remembered per sheet: the test before this one left it at the write-up.
    fireEvent.click(screen.getByRole('tab', { name: 'While playing' }));
    // While playing: a flag key pressed with the player focused still counts.
    play.focus();
    fireEvent.keyDown(play, { key: 'f' });
    await waitFor(() => expect(screen.getByTestId('count-slip')).toHaveTextContent('1'));
    // Write-up: the player stays on the desk and a digit still marks the focused row.
    fireEvent.click(screen.getByRole('tab', { name: 'Write-up' }));
    expect(screen.getByRole('slider', { name: 'Position' })).toBeInTheDocument();
    const first = screen.getByRole('group', { name: /Request 1, Note accuracy/ });
    first.focus();
    fireEvent.keyDown(first, { key: '4' });
    expect(screen.getByRole('group', { name: /Request 1, Freedom from tension/ })).toHaveFocus();
  });
});
