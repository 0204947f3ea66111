// Home's "Next for you": the next task for each role the user holds.
import { describe, expect, it } from 'vitest';
import type { ProgramDto } from '../../shared/schemas/program.schema';
import { homeTasks } from '../../src/app/routes/home-tasks';

const ellis = { id: 'u-ellis', name: 'Ellis', email: 'ellis@x.example' };
const rowan = { id: 'u-rowan', name: 'Rowan', email: 'rowan@x.example' };
const rev = (id: string, label: string, state: string, author: typeof ellis, over: Record<string, unknown> = {}) =>
  ({ id, programId: 'p', label, state, author, reviewer: null, centroidName: 'x.csv', placements: 10, checkedAt: null, errors: null, warnings: null, openErrors: null, submittedAt: null, releasedAt: null, createdAt: '', updatedAt: '', version: 1, ...over });
const program = (name: string, revisions: unknown[]) => ({ id: name, name, product: '', board: '', owner: null, createdAt: '', updatedAt: '', revisions }) as unknown as ProgramDto;

describe('home tasks', () => {
  it('an engineer: reviews of others first, then own drafts at the stage that is next', () => {
    const programs = [
      program('weather', [rev('r1', 'A', 'draft', ellis, { centroidName: null })]),
      program('strip', [rev('r2', 'B', 'in-review', rowan)]),
      program('relay', [rev('r3', 'A', 'draft', ellis, { errors: 3, openErrors: 2 })]),
      program('clock', [rev('r4', 'C', 'draft', ellis, { errors: 0, openErrors: 0 })]),
      program('other', [rev('r5', 'A', 'draft', rowan)]),
    ];
    const t = homeTasks({ id: ellis.id, roles: ['engineer'] }, { programs });
    expect(t.map((x) => [x.title, x.to])).toEqual([
      ['Review strip rev B', '/programs/revisions/r2/release'],
      ['Continue weather rev A', '/programs/revisions/r1/import'],
      ['Continue relay rev A', '/programs/revisions/r3/verify'],
      ['Continue clock rev C', '/programs/revisions/r4/release'],
    ]);
    expect(t[2].detail).toBe('2 errors to fix or waive');
  });

  it('an engineer with nothing open is pointed at Programs', () => {
    expect(homeTasks({ id: ellis.id, roles: ['engineer'] }, { programs: [] })[0].to).toBe('/programs');
  });

  it('a librarian: open proposals and unmatched footprints', () => {
    const t = homeTasks({ id: 'l', roles: ['librarian'] }, {
      proposals: [{ status: 'open', proposerEmail: 'a@x' }, { status: 'approved', proposerEmail: 'b@x' }] as never,
      unmatched: [{ status: 'open', footprint: 'SOT-999' }, { status: 'resolved', footprint: 'R0402' }] as never,
    });
    expect(t.map((x) => x.title)).toEqual(['Decide 1 proposal', 'Give 1 footprint a package']);
    expect(t[1].detail).toMatch(/SOT-999/);
  });

  it('an operator: the latest release', () => {
    const t = homeTasks({ id: 'o', roles: ['operator'] }, {
      runFiles: [
        { programName: 'strip', label: 'A', state: 'released', releasedAt: '2026-01-01T00:00:00Z' },
        { revisionId: 'wb', programName: 'weather', label: 'B', state: 'released', releasedAt: '2026-02-01T00:00:00Z' },
        { programName: 'weather', label: 'A', state: 'superseded', releasedAt: '2026-03-01T00:00:00Z' },
      ] as never,
    });
    expect(t).toHaveLength(1);
    expect(t[0].title).toBe('Set up weather rev B');
    expect(t[0].to).toBe('/run-files/wb/setup-sheet');
  });

  it('an admin: users without a role, or never signed in', () => {
    const t = homeTasks({ id: 'a', roles: ['admin'] }, {
      users: [
        { email: 'n@x', roles: [], active: true, lastSignInAt: null },
        { email: 'm@x', roles: ['operator'], active: true, lastSignInAt: null },
        { email: 'k@x', roles: ['operator'], active: false, lastSignInAt: null },
      ] as never,
    });
    expect(t.map((x) => x.to)).toEqual(['/admin/users', '/admin/outbox']);
  });

  it('only the roles the user holds, and only once their data is there', () => {
    expect(homeTasks({ id: 'x', roles: ['operator', 'librarian'] }, { runFiles: [] })).toHaveLength(1);
  });
});
