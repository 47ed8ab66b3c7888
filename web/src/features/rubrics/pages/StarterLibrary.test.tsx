import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { RubricSummary, StarterLibraryView } from '@stavemark/shared';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const RUBRIC_ID = '3f1c0a52-8d0e-4c1a-9b7e-0a1b2c3d4e01';
const LIST_ID = '3f1c0a52-8d0e-4c1a-9b7e-0a1b2c3d4e21';

const library = (adoptedScales: boolean): StarterLibraryView => ({
  rubrics: [
    {
      key: 'passages',
      name: 'Passages and studies',
      kinds: ['passage', 'other'],
      criteriaCount: 6,
      adopted: null,
    },
    {
      key: 'scales',
      name: 'Scales and chromatic scales',
      kinds: ['scale', 'chromatic'],
      criteriaCount: 7,
      adopted: adoptedScales ? { id: RUBRIC_ID, name: 'Scales and chromatic scales' } : null,
    },
  ],
  requirementLists: [
    {
      key: 'grade-1',
      name: 'Grade 1 technique',
      grade: '1',
      totalMarks: 30,
      lineCount: 5,
      rubricKeys: ['scales', 'arpeggios'],
      adopted: null,
    },
  ],
});
const starterRubric = {
  id: RUBRIC_ID,
  name: 'Scales and chromatic scales',
  kinds: ['scale', 'chromatic'],
  starterKey: 'scales',
  latest: {
    id: 'v1',
    rubricId: RUBRIC_ID,
    version: 1,
    status: 'published',
    name: 'Scales and chromatic scales',
    kinds: ['scale', 'chromatic'],
    criteriaCount: 7,
    createdAt: '2026-11-30T10:00:00.000Z',
    publishedAt: '2026-11-30T10:00:00.000Z',
  },
  published: null,
  versionCount: 1,
} as unknown as RubricSummary;

/** The text a Dropdown shows while nothing is chosen (PrimeReact marks it p-placeholder). */
const placeholderOf = (box: HTMLElement) =>
  box.querySelector('.p-dropdown-label.p-placeholder')?.textContent ?? null;

// Lazy page chunks and PrimeReact load slowly on a shared 2-core machine.
const SLOW = 60_000;

describe('the starter library on the list pages', () => {
  it(
    'adds a starter rubric to the school and then offers to open it',
    async () => {
      let adopted = false;
      const api = mockApi({
        'GET /api/rubrics': () => json(200, adopted ? [starterRubric] : []),
        'GET /api/starter-library': () => json(200, library(adopted)),
        'POST /api/starter-library/rubrics': () => {
          adopted = true;
          return json(201, {
            ...starterRubric.latest,
            criteria: [],
            createdBy: null,
            publishedBy: null,
          });
        },
      });
      renderApp('/rubrics', makeSession(makeUser(['teacher'])));
      await userEvent.click(
        await screen.findByRole('button', { name: 'Add from the starter library' }),
      );
      const dialog = await screen.findByRole('dialog', { name: 'Add from the starter library' });
      const scales = await within(dialog).findByRole('listitem', {
        name: 'Scales and chromatic scales',
      });
      expect(
        within(scales).getByText('For scales, chromatic scales · 7 criteria'),
      ).toBeInTheDocument();
      await userEvent.click(
        within(scales).getByRole('button', { name: 'Add “Scales and chromatic scales”' }),
      );
      expect(api.calls('POST /api/starter-library/rubrics')[0]?.body).toEqual({ key: 'scales' });
      // The library is asked again: the entry is now the school's, with a way to it.
      await waitFor(() => expect(within(scales).getByText('In your school')).toBeInTheDocument());
      expect(within(scales).getByRole('link', { name: 'Open' })).toHaveAttribute(
        'href',
        `/rubrics/${RUBRIC_ID}`,
      );
      // …and the table shows the new rubric with its tag apart from the name.
      await userEvent.keyboard('{Escape}');
      const table = await screen.findByRole('table', { name: 'Rubrics' });
      const row = await within(table).findByRole('row', { name: /Scales and chromatic scales/ });
      expect(
        within(row).getByRole('link', { name: 'Scales and chromatic scales' }),
      ).toBeInTheDocument();
      expect(within(row).getByText('From the starter library')).toBeInTheDocument();
      expect(row.textContent).toMatch(/Scales and chromatic scales\s+From the starter library/);
    },
    SLOW,
  );

  it(
    'shows the API’s refusal of a duplicate in the dialog',
    async () => {
      mockApi({
        'GET /api/requirement-lists': () => json(200, []),
        'GET /api/starter-library': () => json(200, library(false)),
        'POST /api/starter-library/requirement-lists': () =>
          apiError(
            409,
            '"Grade 1 technique" from the starter library is already in your school; open it on the Requirement lists page (edit it there to make a new version).',
            { details: [{ path: 'key', message: `already added (list ${LIST_ID})` }] },
          ),
      });
      renderApp('/requirement-lists', makeSession(makeUser(['admin'])));
      await userEvent.click(
        await screen.findByRole('button', { name: 'Add from the starter library' }),
      );
      const dialog = await screen.findByRole('dialog', { name: 'Add from the starter library' });
      const grade1 = await within(dialog).findByRole('listitem', { name: 'Grade 1 technique' });
      expect(within(grade1).getByText('Grade 1 · 5 lines · 30 marks')).toBeInTheDocument();
      await userEvent.click(
        within(grade1).getByRole('button', { name: 'Add “Grade 1 technique”' }),
      );
      expect(
        await within(dialog).findByText(
          /is already in your school; open it on the Requirement lists page/,
        ),
      ).toBeInTheDocument();
    },
    SLOW,
  );

  it(
    'is not offered to examiners, who never ask for it',
    async () => {
      const api = mockApi({ 'GET /api/rubrics': () => json(200, [starterRubric]) });
      renderApp('/rubrics', makeSession(makeUser(['examiner'])));
      await screen.findByRole('link', { name: 'Scales and chromatic scales' });
      expect(
        screen.queryByRole('button', { name: 'Add from the starter library' }),
      ).not.toBeInTheDocument();
      expect(api.calls('GET /api/starter-library')).toHaveLength(0);
    },
    SLOW,
  );

  it(
    'filters start empty with placeholders, and a chosen one goes to the API',
    async () => {
      const api = mockApi({ 'GET /api/rubrics': () => json(200, [starterRubric]) });
      renderApp('/rubrics', makeSession(makeUser(['teacher'])));
      await screen.findByRole('link', { name: 'Scales and chromatic scales' });
      const kindBox = screen
        .getByLabelText('Kind of request')
        .closest('.p-dropdown') as HTMLElement;
      const stateBox = screen.getByLabelText('State').closest('.p-dropdown') as HTMLElement;
      expect(placeholderOf(kindBox)).toBe('Every kind');
      expect(placeholderOf(stateBox)).toBe('Any state');
      expect(api.calls('GET /api/rubrics')[0]?.query.toString()).toBe('');

      const user = userEvent.setup();
      await user.click(stateBox);
      await user.click(
        await screen.findByRole('option', { name: 'Latest is a draft', hidden: true }),
      );
      await waitFor(() =>
        expect(api.calls('GET /api/rubrics').at(-1)?.query.get('status')).toBe('draft'),
      );
    },
    SLOW,
  );

  it(
    'the Requirement lists page filters by grade and state, placeholders first',
    async () => {
      const list = {
        id: LIST_ID,
        name: 'Grade 1 technique',
        grade: '1',
        starterKey: 'grade-1',
        latest: {
          id: 'lv1',
          listId: LIST_ID,
          version: 1,
          status: 'published',
          name: 'Grade 1 technique',
          grade: '1',
          totalMarks: 30,
          lineCount: 5,
          usedAt: null,
          createdAt: '2026-11-30T10:00:00.000Z',
          publishedAt: '2026-11-30T10:00:00.000Z',
        },
        published: null,
        versionCount: 1,
      };
      const api = mockApi({
        'GET /api/requirement-lists': () =>
          json(200, [
            list,
            { ...list, id: `${LIST_ID.slice(0, -1)}9`, grade: '3', name: 'Grade 3 technique' },
          ]),
      });
      renderApp('/requirement-lists', makeSession(makeUser(['teacher'])));
      await screen.findByRole('link', { name: 'Grade 3 technique' });
      const gradeBox = screen.getByLabelText('Grade').closest('.p-dropdown') as HTMLElement;
      expect(placeholderOf(gradeBox)).toBe('Every grade');
      expect(
        placeholderOf(screen.getByLabelText('State').closest('.p-dropdown') as HTMLElement),
      ).toBe('Any state');
      const user = userEvent.setup();
      await user.click(gradeBox);
      await user.click(await screen.findByRole('option', { name: 'Grade 3', hidden: true }));
      await waitFor(() =>
        expect(api.calls('GET /api/requirement-lists').at(-1)?.query.get('grade')).toBe('3'),
      );
    },
    SLOW,
  );
});
