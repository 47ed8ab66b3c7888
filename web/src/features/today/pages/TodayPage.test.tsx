import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import { renderApp } from '@/test/render';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

describe('Today page', () => {
  it('shows the organisation-local date and only the sections the API sent', async () => {
    mockApi({
      'GET /api/today': () =>
        json(200, {
          date: '2026-12-01',
          timeZone: 'Europe/London',
          organisationName: 'Larkfield Music School',
          roles: ['teacher', 'examiner'],
          teacher: {
            classes: [
              { id: 'c1', name: 'Tuesday juniors', code: 'TUE-J', grade: 2, studentCount: 9 },
              { id: 'c2', name: 'Open studio', code: 'OPEN', grade: null, studentCount: 4 },
            ],
          },
          examiner: { sittings: [] },
        }),
    });
    renderApp('/', makeSession(makeUser(['teacher', 'examiner'])));

    const when = await screen.findByText(/1 December 2026/);
    expect(when).toHaveAttribute('dateTime', '2026-12-01');
    expect(screen.getByText(/Larkfield Music School \(Europe\/London time\)/)).toBeInTheDocument();

    const classes = screen.getByRole('region', { name: 'Your classes' });
    const rows = within(classes).getAllByRole('row');
    expect(rows.map((r) => r.textContent)).toEqual([
      'ClassCodeGradeStudents',
      'Tuesday juniorsTUE-J29',
      'Open studioOPEN—4',
    ]);
    expect(screen.getByRole('region', { name: 'Your sittings today' })).toHaveTextContent(
      'No sittings are assigned to you today.',
    );
    expect(screen.queryByRole('region', { name: 'The organisation' })).not.toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Your lessons' })).not.toBeInTheDocument();
  });

  it('lists an examiner’s sittings with times in the organisation’s zone and a way to the desk', async () => {
    mockApi({
      'GET /api/today': () =>
        json(200, {
          date: '2026-07-01',
          timeZone: 'Europe/London',
          organisationName: 'Larkfield Music School',
          roles: ['examiner'],
          examiner: {
            sittings: [
              {
                id: 's1',
                title: 'Summer mock, grade 3',
                room: 'Studio 2',
                status: 'scheduled',
                // 08:30 UTC is 09:30 in London in July: British Summer Time is UTC+1 (IANA tz database).
                startsAt: '2026-07-01T08:30:00.000Z',
                endsAt: '2026-07-01T11:00:00.000Z',
                mySlots: 6,
              },
            ],
          },
        }),
    });
    renderApp('/', makeSession(makeUser(['examiner'])));
    const region = await screen.findByRole('region', { name: 'Your sittings today' });
    const rows = within(region).getAllByRole('row');
    expect(rows[1]?.textContent).toBe('Summer mock, grade 3Studio 209:30–12:006 candidates');
    expect(within(region).getByRole('link', { name: 'Open the marking desk' })).toHaveAttribute('href', '/marking');
  });

  it('gives an administrator the figures and the current term', async () => {
    mockApi({
      'GET /api/today': () =>
        json(200, {
          date: '2026-12-01',
          timeZone: 'Europe/London',
          organisationName: 'Larkfield Music School',
          roles: ['admin'],
          admin: {
            people: 48,
            students: 40,
            classes: 4,
            term: { name: 'Autumn term', startsOn: '2026-09-02', endsOn: '2026-12-18' },
          },
        }),
    });
    renderApp('/', makeSession(makeUser(['admin'])));
    const section = await screen.findByRole('region', { name: 'The organisation' });
    expect(within(section).getByText('Students').nextElementSibling).toHaveTextContent('40');
    expect(section).toHaveTextContent('Current term: Autumn term, 2 Sept 2026 to 18 Dec 2026.');
    expect(within(section).getByRole('link', { name: 'Manage people' })).toHaveAttribute(
      'href',
      '/people',
    );
  });

  it('gives a student their classes and teachers', async () => {
    mockApi({
      'GET /api/today': () =>
        json(200, {
          date: '2026-12-01',
          timeZone: 'Europe/London',
          organisationName: 'Larkfield Music School',
          roles: ['student'],
          student: {
            name: 'Mira Osei',
            grade: 4,
            classes: [
              { id: 'c1', name: 'Grade 4 group', code: 'G4', teachers: ['Ada Quill', 'Tom Reyes'] },
            ],
          },
        }),
    });
    renderApp('/', makeSession(makeUser(['student'])));
    const section = await screen.findByRole('region', { name: 'Your lessons' });
    expect(section).toHaveTextContent('Mira Osei, preparing grade 4.');
    expect(section).toHaveTextContent('Ada Quill, Tom Reyes');
  });

  it('says clearly when today could not be loaded', async () => {
    mockApi({ 'GET /api/today': () => apiError(403, 'Your membership here is not active.') });
    renderApp('/', makeSession(makeUser(['teacher'])));
    expect(await screen.findByRole('alert')).toHaveTextContent(
      "Could not load today's page. Your membership here is not active.",
    );
  });
});
