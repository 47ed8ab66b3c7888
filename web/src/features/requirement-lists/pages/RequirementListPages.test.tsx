import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type {
  RequirementListDetail,
  RequirementListVersionView,
  RubricSummary,
} from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const LIST_ID = '7a2b0c11-1d2e-4f30-8a41-5b6c7d8e9f01';
const V1 = '7a2b0c11-1d2e-4f30-8a41-5b6c7d8e9f11';
const RV = '7a2b0c11-1d2e-4f30-8a41-5b6c7d8e9f21';

const rubric: RubricSummary = {
  id: '7a2b0c11-1d2e-4f30-8a41-5b6c7d8e9f31',
  name: 'Scales',
  kinds: ['scale', 'arpeggio'],
  starterKey: 'scales',
  latest: {
    id: RV,
    rubricId: 'r',
    version: 1,
    status: 'published',
    name: 'Scales',
    kinds: ['scale', 'arpeggio'],
    criteriaCount: 3,
    createdAt: '2026-11-01T09:00:00.000Z',
    publishedAt: '2026-11-01T09:00:00.000Z',
  },
  published: {
    id: RV,
    rubricId: 'r',
    version: 1,
    status: 'published',
    name: 'Scales',
    kinds: ['scale', 'arpeggio'],
    criteriaCount: 3,
    createdAt: '2026-11-01T09:00:00.000Z',
    publishedAt: '2026-11-01T09:00:00.000Z',
  },
  versionCount: 1,
};
const draft: RequirementListVersionView = {
  id: V1,
  listId: LIST_ID,
  version: 1,
  status: 'draft',
  name: 'Grade 2 technique',
  grade: '2',
  totalMarks: 20,
  usedAt: null,
  createdAt: '2026-11-02T09:00:00.000Z',
  publishedAt: null,
  createdBy: null,
  publishedBy: null,
  selectionRule: { count: 2, minPerKind: { scale: 1 } },
  lines: [
    {
      id: 'line-a',
      kind: 'scale',
      keys: ['C', 'G', 'F'],
      modes: ['major'],
      hands: ['RH', 'LH'],
      motions: [],
      octaves: [1],
      articulations: ['legato'],
      dynamics: [],
      inversions: [],
      tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
      rubricVersionId: RV,
      difficultyWeight: 1,
      rubric: { id: RV, rubricId: 'r', name: 'Scales', version: 1, status: 'published' },
    },
  ],
};
const detail: RequirementListDetail = {
  id: LIST_ID,
  name: draft.name,
  grade: '2',
  starterKey: null,
  latest: { ...draft, lineCount: 1 },
  published: null,
  versionCount: 1,
  versions: [{ ...draft, lineCount: 1 }],
};

function api() {
  return mockApi({
    'GET /api/rubrics': () => json(200, [rubric]),
    [`GET /api/requirement-lists/${LIST_ID}`]: () => json(200, detail),
    [`GET /api/requirement-list-versions/${V1}`]: () => json(200, draft),
    [`PUT /api/requirement-list-versions/${V1}`]: (req) =>
      json(200, { ...draft, ...(req.body as object) }),
  });
}

// Typing into the whole form is slow on a shared 2-core machine (load ~20 measured).
vi.setConfig({ testTimeout: 60_000 });

describe('Requirement list pages', () => {
  it('computes note count, notes per second and duration while the teacher types', async () => {
    api();
    const user = userEvent.setup();
    renderApp(`/requirement-lists/${LIST_ID}/edit`, makeSession(makeUser(['teacher'])));
    const timing = await screen.findByRole('table', { name: /^Timing of/ });
    // One octave up and down: 2·8−1 = 15 notes; 60·2/60 = 2 a second; 7.5 s (worked by hand).
    expect(
      within(timing).getByRole('row', { name: '1 octave, up and down 15 2.00 7.5 s' }),
    ).toBeInTheDocument();
    await user.clear(screen.getByLabelText('Beats per minute'));
    // While the tempo is empty the line says what is missing instead of a timing.
    expect(screen.getByText(/Give the tempo/)).toBeInTheDocument();
    await user.type(screen.getByLabelText('Beats per minute'), '120');
    // 120·2/60 = 4 a second; 15 / 4 = 3.75 s, shown to a tenth.
    const retimed = await screen.findByRole('table', { name: /^Timing of/ });
    expect(
      within(retimed).getByRole('row', { name: '1 octave, up and down 15 4.00 3.8 s' }),
    ).toBeInTheDocument();
    expect(screen.getByLabelText('Tempo in words')).toHaveTextContent('crotchet = 120, quavers');
  });

  it('writes note values in the American convention for a person who chose it', async () => {
    api();
    renderApp(
      `/requirement-lists/${LIST_ID}/edit`,
      makeSession(makeUser(['teacher'], { noteNames: 'american' })),
    );
    expect(await screen.findByLabelText('Tempo in words')).toHaveTextContent(
      'quarter = 60, eighths',
    );
  });

  it('previews a draw that honours the rule, the same for the same seed', async () => {
    api();
    const user = userEvent.setup();
    renderApp(`/requirement-lists/${LIST_ID}/edit`, makeSession(makeUser(['teacher'])));
    const draw = await screen.findByRole('table', { name: 'Sample draw' });
    const rows = () => within(draw).getAllByRole('row').slice(1, -1); // without header and total
    expect(rows()).toHaveLength(2);
    const first = rows().map((r) => r.textContent);
    await user.clear(screen.getByLabelText('Seed'));
    await user.type(screen.getByLabelText('Seed'), 'another');
    await user.clear(screen.getByLabelText('Seed'));
    await user.type(screen.getByLabelText('Seed'), 'preview');
    expect(rows().map((r) => r.textContent)).toEqual(first);
    // Asking for more requests than the line can give says why instead of drawing.
    await user.clear(screen.getByLabelText('Requests asked'));
    await user.type(screen.getByLabelText('Requests asked'), '9');
    expect(
      await screen.findByText(
        'The rule asks for 9 requests, but the list offers only 6 different one(s).',
      ),
    ).toBeInTheDocument();
  });

  it('saves a draft with the body the API takes (the rubric names are not sent)', async () => {
    const mock = api();
    const user = userEvent.setup();
    renderApp(`/requirement-lists/${LIST_ID}/edit`, makeSession(makeUser(['teacher'])));
    await user.clear(await screen.findByLabelText('Total marks'));
    await user.type(screen.getByLabelText('Total marks'), '25');
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() =>
      expect(mock.calls(`PUT /api/requirement-list-versions/${V1}`)).toHaveLength(1),
    );
    const body = mock.calls(`PUT /api/requirement-list-versions/${V1}`)[0]?.body as Record<
      string,
      unknown
    >;
    expect(body).toMatchObject({
      name: 'Grade 2 technique',
      grade: '2',
      totalMarks: 25,
      selectionRule: { count: 2, minPerKind: { scale: 1 } },
    });
    expect((body.lines as Record<string, unknown>[])[0]).not.toHaveProperty('rubric');
    expect((body.lines as Record<string, unknown>[])[0]).toMatchObject({
      id: 'line-a',
      rubricVersionId: RV,
      keys: ['C', 'G', 'F'],
    });
  });
});
