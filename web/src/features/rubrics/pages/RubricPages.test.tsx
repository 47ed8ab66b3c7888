import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { RubricDetail, RubricSummary, RubricVersionView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const RUBRIC_ID = '3f1c0a52-8d0e-4c1a-9b7e-0a1b2c3d4e01';
const V1 = '3f1c0a52-8d0e-4c1a-9b7e-0a1b2c3d4e11';
const V2 = '3f1c0a52-8d0e-4c1a-9b7e-0a1b2c3d4e12';

const criteria: RubricVersionView['criteria'] = [
  {
    key: 'note_accuracy',
    label: 'Note accuracy',
    weight: 3,
    maxMark: 10,
    descriptors: [{ min: 0, max: 10, text: 'As heard.' }],
  },
  {
    key: 'freedom_from_tension',
    label: 'Freedom from tension',
    weight: 1,
    maxMark: 5,
    descriptors: [{ min: 1, max: 5, text: 'Free.' }],
  },
];
const version = (id: string, n: number, status: 'draft' | 'published'): RubricVersionView => ({
  id,
  rubricId: RUBRIC_ID,
  version: n,
  status,
  name: 'Scales for grade 3',
  kinds: ['scale'],
  criteria,
  createdAt: '2026-11-30T10:00:00.000Z',
  publishedAt: status === 'published' ? '2026-11-30T11:00:00.000Z' : null,
  createdBy: { id: 'p1', displayName: 'Ada Quill' },
  publishedBy: status === 'published' ? { id: 'p1', displayName: 'Ada Quill' } : null,
});
const summaryOf = (v: RubricVersionView) => ({ ...v, criteriaCount: v.criteria.length });
const summary: RubricSummary = {
  id: RUBRIC_ID,
  name: 'Scales for grade 3',
  kinds: ['scale'],
  starterKey: null,
  latest: summaryOf(version(V2, 2, 'draft')),
  published: summaryOf(version(V1, 1, 'published')),
  versionCount: 2,
};
const detail: RubricDetail = { ...summary, versions: [summary.latest, summary.published!] };

// Typing into the whole form is slow on a shared 2-core machine (load ~20 measured).
vi.setConfig({ testTimeout: 60_000 });

describe('Rubrics pages', () => {
  it('lists rubrics with their latest and published versions; teachers can import and create', async () => {
    mockApi({ 'GET /api/rubrics': () => json(200, [summary]) });
    renderApp('/rubrics', makeSession(makeUser(['teacher'])));
    const table = await screen.findByRole('table', { name: 'Rubrics' });
    const row = await within(table).findByRole('row', { name: /Scales for grade 3/ });
    expect(within(row).getByText('Version 2 · draft')).toBeInTheDocument();
    expect(within(row).getByText('Version 1')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'New rubric' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Import a file' })).toBeInTheDocument();
  });

  it('examiners read but do not see the editing buttons', async () => {
    mockApi({ 'GET /api/rubrics': () => json(200, [summary]) });
    renderApp('/rubrics', makeSession(makeUser(['examiner'])));
    await screen.findByRole('link', { name: 'Scales for grade 3' });
    expect(screen.queryByRole('button', { name: 'New rubric' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Import a file' })).not.toBeInTheDocument();
  });

  it('shows an import refusal with every problem and its place in the file', async () => {
    const api = mockApi({
      'GET /api/rubrics': () => json(200, [summary]),
      'POST /api/rubrics/import': () =>
        apiError(
          400,
          'The file is not a valid rubric: rubric.criteria.0.weight: Weight must be greater than 0. (and 1 more problem)',
          {
            details: [
              { path: 'rubric.criteria.0.weight', message: 'Weight must be greater than 0.' },
              { path: 'rubric.criteria.1.maxMark', message: 'Maximum mark is 1 to 10.' },
            ],
          },
        ),
    });
    renderApp('/rubrics', makeSession(makeUser(['teacher'])));
    await screen.findByRole('link', { name: 'Scales for grade 3' });
    const file = new File(['{"format":"stavemark.rubric"}'], 'scales.rubric.json', {
      type: 'application/json',
    });
    await userEvent.upload(screen.getByLabelText('Rubric file to import'), file);
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('The file was not imported.');
    expect(within(alert).getByText('rubric.criteria.1.maxMark')).toBeInTheDocument();
    expect(api.calls('POST /api/rubrics/import')).toHaveLength(1);
  });

  it('shows a version’s criteria, the health note beside tension, and marks left undescribed', async () => {
    mockApi({
      [`GET /api/rubrics/${RUBRIC_ID}`]: () => json(200, detail),
      [`GET /api/rubric-versions/${V1}`]: () => json(200, version(V1, 1, 'published')),
      [`GET /api/rubric-versions/${V2}`]: () => json(200, version(V2, 2, 'draft')),
    });
    renderApp(`/rubrics/${RUBRIC_ID}?version=1`, makeSession(makeUser(['teacher'])));
    expect(
      await screen.findByText('You are looking at version 1. The latest is version 2 (a draft).'),
    ).toBeInTheDocument();
    const tension = (await screen.findByRole('heading', { name: 'Freedom from tension' })).closest(
      'li',
    )!;
    expect(within(tension as HTMLElement).getByRole('note')).toHaveTextContent(
      'seek advice from a qualified health professional',
    );
    expect(
      within(tension as HTMLElement).getByText('No descriptor for mark 0.'),
    ).toBeInTheDocument();
    // Weight 3 of 4 = 75 %.
    expect(screen.getByText('(75 %)')).toBeInTheDocument();
    // A published version with a draft after it: the teacher is sent to the draft, not to edit v1.
    expect(screen.getByRole('button', { name: 'Open the draft (version 2)' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit as a new version' })).not.toBeInTheDocument();
  });

  it('the form refuses a weight of 0 and a key the API says is taken, beside the field, and sends nothing invalid', async () => {
    const api = mockApi({
      'POST /api/rubrics': () =>
        apiError(400, 'criteria.0.key: Key "note_accuracy" is used twice.', {
          details: [{ path: 'criteria.0.key', message: 'Key "note_accuracy" is used twice.' }],
        }),
    });
    const user = userEvent.setup();
    renderApp('/rubrics/new', makeSession(makeUser(['teacher'])));
    await user.type(await screen.findByLabelText('Name'), 'Arpeggios check');
    await user.click(screen.getByLabelText('Arpeggios'));
    await user.type(screen.getByLabelText('Label'), 'Note accuracy');
    await user.tab(); // the key is suggested from the label
    expect(screen.getByLabelText('Key')).toHaveValue('note_accuracy');
    await user.clear(screen.getByLabelText('Weight'));
    await user.type(screen.getByLabelText('Weight'), '0');
    for (const [i, box] of screen.getAllByLabelText(/level \d+: descriptor$/).entries())
      await user.type(box, `Level ${i + 1}`);
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(await screen.findByText('Weight must be greater than 0.')).toBeInTheDocument();
    expect(api.calls('POST /api/rubrics')).toHaveLength(0);

    await user.clear(screen.getByLabelText('Weight'));
    await user.type(screen.getByLabelText('Weight'), '2');
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(api.calls('POST /api/rubrics')).toHaveLength(1));
    expect(api.calls('POST /api/rubrics')[0]?.body).toEqual({
      name: 'Arpeggios check',
      kinds: ['arpeggio'],
      criteria: [
        {
          key: 'note_accuracy',
          label: 'Note accuracy',
          description: '',
          weight: 2,
          maxMark: 5,
          descriptors: [
            { min: 0, max: 1, text: 'Level 1' },
            { min: 2, max: 3, text: 'Level 2' },
            { min: 4, max: 5, text: 'Level 3' },
          ],
        },
      ],
    });
    expect(await screen.findByText('Key "note_accuracy" is used twice.')).toBeInTheDocument();
  });
});
