// Trusting a review, on the pages as the user meets them:
// the review summary and the release confirmation, "waive on every board" on Verify, the package
// safeguard before a shared edit, and the override form's Cancel and kept filter.
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { runJob } from '../../shared/pipeline';
import { runResultToJson } from '../../shared/pipeline';
import type { RunResult, Side } from '../../shared/core';
import type { Finding } from '../../shared/schemas/finding.schema';
import { jobSchema } from '../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { blankPackage, type NozzleDto, type PackageDto, type PackageUsage } from '../../shared/schemas/library.schema';
import { revisionDetailSchema, reviewSummarySchema, settingsFromJob, type RevisionDetail, type ReviewSummaryDto } from '../../shared/schemas/program.schema';
import { verifyInputFromRuns } from '../../shared/verify';
import { verify } from '../../shared/verify';
import { libraryRoute } from '../../src/app/routes/library/routes';
import { changesPlacement } from '../../src/app/routes/library/package-edit';
import AssignStage from '../../src/app/routes/programs/stages/assign';
import ReleaseStage from '../../src/app/routes/programs/stages/release';
import VerifyStage from '../../src/app/routes/programs/stages/verify';
import WorkspaceRoute from '../../src/app/routes/programs/workspace';
import { waivedWhat } from '../../src/features/programs/lib/finding-labels';
import { mockFetch, renderRoutes } from '../helpers/render';

// ---- the faulty sample, run by the engine as the server would ---------------------------------
const jobJson = JSON.parse(readFileSync('samples/faulty/job.json', 'utf8'));
const job = jobSchema.parse(jobJson);
const library = libraryFileSchema.parse(JSON.parse(readFileSync('samples/library.json', 'utf8')));
const csv = readFileSync('samples/faulty/faulty.csv', 'utf8');
const runs = {} as Record<Side, RunResult>;
for (const side of ['top', 'bottom'] as const) runs[side] = runJob({ job, centroidText: csv, library, side });
const allFindings: Finding[] = verify(verifyInputFromRuns([runs.top, runs.bottom])).findings;

const REV = '7a1f0c2e-4b1d-4c3e-9f00-000000000001';
const PROG = '7a1f0c2e-4b1d-4c3e-9f00-000000000002';
const T = '2026-12-01T10:00:00.000Z';
const ellis = { id: '7a1f0c2e-4b1d-4c3e-9f00-000000000003', name: 'Ellis Author', email: 'ellis@harrowcreek.example' };

function detail(over: Partial<RevisionDetail> = {}): RevisionDetail {
  const findings = over.findings ?? allFindings;
  const errors = findings.filter((f) => f.severity === 'error').length;
  return revisionDetailSchema.parse({
    id: REV,
    programId: PROG,
    label: 'B',
    state: 'draft',
    author: ellis,
    reviewer: null,
    centroidName: 'faulty.csv',
    placements: 13,
    checkedAt: T,
    errors,
    warnings: findings.length - errors,
    openErrors: errors,
    submittedAt: null,
    releasedAt: null,
    createdAt: T,
    updatedAt: T,
    version: 3,
    program: { id: PROG, name: 'fault-demo', product: 'Test fixture', board: 'F-1' },
    settings: settingsFromJob(jobJson),
    centroidSha256: null,
    imported: { rows: 14, dnp: 1, top: 11, bottom: 2, units: 'mm', columns: {}, headers: [], dialect: {}, warnings: [] },
    overrides: {},
    findingsSummary: { errors, warnings: findings.length - errors, placements: 26, seconds: 0.01 },
    waivers: [],
    comments: [],
    releaseFiles: [],
    reviewComment: null,
    reviewedAt: null,
    hasUnderlay: false,
    can: { edit: true, submit: true, review: false, withdraw: true, newRevision: false },
    ...over,
    findings,
  });
}

type Answer = { status: number; body?: unknown };
/** The revision's routes answered from `state`; `extra` answers the test's own calls first. */
function serve(state: { rev: RevisionDetail; summary?: ReviewSummaryDto }, extra: (url: string, init?: RequestInit) => Answer | undefined = () => undefined) {
  return mockFetch((url, init) => {
    const hit = extra(url, init);
    if (hit) return hit;
    const method = init?.method ?? 'GET';
    if (method !== 'GET') return undefined;
    if (url === '/api/auth/csrf') return { status: 200, body: { token: 'tok' } };
    if (url === '/api/me') return { status: 200, body: { user: { ...ellis, roles: ['engineer'], active: true, lastSignInAt: null, createdAt: T, version: 1 } } };
    if (url === `/api/revisions/${REV}`) return { status: 200, body: state.rev };
    if (url === `/api/revisions/${REV}/review-summary` && state.summary) return { status: 200, body: state.summary };
    const run = /^\/api\/revisions\/[^/]+\/run\?side=(top|bottom)$/.exec(url);
    if (run) return { status: 200, body: runResultToJson(runs[run[1] as Side]) };
    if (url === `/api/revisions/${REV}/underlay`) return { status: 200, body: {} };
    if (url === '/api/library/file') return { status: 200, body: library };
    if (url === '/api/library/packages') return { status: 200, body: { items: [] } };
    return undefined;
  });
}

function renderStage(stage: 'verify' | 'release' | 'assign') {
  const Stage = { verify: VerifyStage, release: ReleaseStage, assign: AssignStage }[stage];
  return renderRoutes([{ path: '/programs/revisions/:revisionId', element: <WorkspaceRoute />, children: [{ path: stage, element: <Stage /> }] }], `/programs/revisions/${REV}/${stage}`);
}

const bodyOverlaps = allFindings.filter((f) => f.kind === 'body-overlap');
const everyBoardWaiver = { id: '7a1f0c2e-4b1d-4c3e-9f00-0000000000aa', findingKey: 'body-overlap|*:R1|*:R2', scope: 'every-board' as const, kind: 'body-overlap', reason: 'R1/R2 are a stacked footprint by design', userEmail: ellis.email, at: T, covers: 2 };

afterEach(() => {
  document.body.innerHTML = '';
});

// These pages draw the panel and type into forms: on a loaded machine that takes seconds, so each
// describe block below allows 20 s per test.

describe('Verify: waive on every board', { timeout: 20_000 }, () => {
  it('offers "waive on every board" for a finding repeated per board and sends one decision', async () => {
    // samples/faulty/README.md: body-overlap 1:R1,1:R2 and 2:R1,2:R2 — the same pair on both boards
    expect(bodyOverlaps.map((f) => f.refs.join())).toEqual(['1:R1,1:R2', '2:R1,2:R2']);
    const state = { rev: detail() };
    const posts: unknown[] = [];
    serve(state, (url, init) => {
      if (url === `/api/revisions/${REV}/waivers` && init?.method === 'POST') {
        posts.push(JSON.parse(String(init.body)));
        state.rev = detail({ waivers: [everyBoardWaiver] });
        return { status: 201, body: everyBoardWaiver };
      }
      return undefined;
    });
    renderStage('verify');
    await userEvent.click(await screen.findByRole('button', { name: /Bodies overlap/ }));
    const offers = screen.getAllByRole('button', { name: 'Waive on every board…' });
    expect(offers).toHaveLength(2); // one per board's finding
    // a finding between boards (board-overlap) is not offered it
    await userEvent.click(screen.getByRole('button', { name: /Boards overlap/ }));
    expect(screen.getAllByRole('button', { name: 'Waive on every board…' })).toHaveLength(2);

    await userEvent.click(offers[0]);
    const form = screen.getByRole('form', { name: 'Waive on every board' });
    expect(form.textContent).toMatch(/boards 1, 2/);
    await userEvent.type(within(form).getByLabelText('Why is this acceptable on every board?'), 'R1/R2 are a stacked footprint by design');
    await userEvent.click(within(form).getByRole('button', { name: 'Waive on 2 boards' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]).toEqual({ key: bodyOverlaps[0].key, reason: 'R1/R2 are a stacked footprint by design', scope: 'every-board' });
  });

  it('names what a waiver covers for people', () => {
    expect(waivedWhat(['1:R1', '1:R2'])).toBe('1:R1, 1:R2');
    expect(waivedWhat(['boards:1,2'])).toBe('boards 1, 2');
    expect(waivedWhat(['panel'])).toBe('the panel');
  });

  it('shows an every-board waiver once, with the findings it covers, on each board’s finding', async () => {
    serve({ rev: detail({ waivers: [everyBoardWaiver] }) });
    renderStage('verify');
    const group = await screen.findByRole('button', { name: /Bodies overlap/ });
    expect(group.textContent).toMatch(/2 · 2 waived/);
    const list = screen.getByRole('region', { name: 'Waivers' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(1);
    expect(list.textContent).toMatch(/R1, R2/);
    expect(list.textContent).toMatch(/Waived on every board \(one waiver, 2 findings\)/);
    await userEvent.click(group);
    expect(screen.getAllByText(/Waived on every board \(one waiver/)).toHaveLength(3); // the list + both boards' rows
    expect(screen.queryAllByRole('button', { name: 'Waive on every board…' })).toHaveLength(0);
  });
});

// ---- the review summary and the release confirmation ------------------------------------------
const reviewFindings = allFindings.filter((f) => f.kind === 'body-overlap' || f.kind === 'courtyard-overlap');
const summary: ReviewSummaryDto = reviewSummarySchema.parse({
  revisionId: REV,
  programId: PROG,
  programName: 'fault-demo',
  label: 'B',
  state: 'in-review',
  checkedAt: T,
  placements: 13,
  findings: { total: 4, errors: 2, warnings: 2, waived: 2, openErrors: 0 },
  byKind: [
    { kind: 'body-overlap', severity: 'error', count: 2, waived: 2, waivers: [{ ...everyBoardWaiver, refs: ['R1', 'R2'], userName: ellis.name }] },
    { kind: 'courtyard-overlap', severity: 'warning', count: 2, waived: 0, waivers: [] },
  ],
  unusedWaivers: [],
  overrides: [{ ref: 'C3', package: null, nozzle: 'N07', vision: null, reason: 'N05 tips wear fast on this line', footprint: 'CAP-0402', instead: { package: 'C0402', nozzle: 'N05', vision: 'chip-small' } }],
  changes: { since: { revisionId: '7a1f0c2e-4b1d-4c3e-9f00-0000000000bb', label: 'A', releasedAt: T }, added: ['D7'], removed: ['R5'], moved: ['D2'], changed: ['Q1'], settings: ['panel'], overrides: ['C3'] },
});

describe('Release: the review summary and a confirmed release', { timeout: 20_000 }, () => {
  const inReview = () => detail({ state: 'in-review', findings: reviewFindings, waivers: [everyBoardWaiver], overrides: { C3: { nozzle: 'N07', reason: 'N05 tips wear fast on this line' } }, can: { edit: false, submit: false, review: true, withdraw: true, newRevision: false } });

  it('the reviewer sees waivers (reason, who, when), overrides with reasons and the changes since the last release', async () => {
    serve({ rev: inReview(), summary });
    renderStage('release');
    const s = await screen.findByRole('region', { name: 'What is approved' });
    await within(s).findByText(/4 findings/);
    const kind = within(s).getByTestId('summary-kind-body-overlap');
    expect(kind.textContent).toMatch(/every board/);
    expect(kind.textContent).toMatch(/R1, R2/);
    expect(kind.textContent).toMatch(/covers 2 findings/);
    expect(kind.textContent).toMatch(/“R1\/R2 are a stacked footprint by design”/);
    expect(kind.textContent).toMatch(/waived by Ellis Author \(ellis@harrowcreek\.example\)/);
    const overrides = within(s).getByRole('table', { name: 'Overrides' });
    expect(overrides.textContent).toMatch(/C3/);
    expect(overrides.textContent).toMatch(/N07instead of N05/); // the override and what the library gives
    expect(overrides.textContent).toMatch(/N05 tips wear fast on this line/);
    expect(within(s).getByTestId('change-counts').textContent).toBe('1 added · 1 removed · 1 moved · 1 with a new footprint or value');
    expect(s.textContent).toMatch(/Compared with revision A/);
    expect(s.textContent).toMatch(/Settings changed: panel/);
  });

  it('"Approve and release" asks first in a keyboard-usable dialog naming the program and revision', async () => {
    const state = { rev: inReview(), summary };
    const approvals: unknown[] = [];
    serve(state, (url, init) => {
      if (url === `/api/revisions/${REV}/approve` && init?.method === 'POST') {
        approvals.push(JSON.parse(String(init.body)));
        state.rev = detail({ ...inReview(), state: 'released', releasedAt: T, can: { edit: false, submit: false, review: false, withdraw: false, newRevision: true } });
        return { status: 200, body: state.rev };
      }
      return undefined;
    });
    renderStage('release');
    const approve = await screen.findByRole('button', { name: 'Approve and release' });
    await userEvent.click(approve);
    const dialog = screen.getByRole('dialog', { name: 'Release fault-demo revision B?' });
    expect(dialog.getAttribute('aria-modal')).toBe('true');
    expect(dialog.textContent).toMatch(/released revisions cannot be changed/);
    const cancel = within(dialog).getByRole('button', { name: 'Cancel' });
    const confirm = within(dialog).getByRole('button', { name: 'Release fault-demo B' });
    expect(document.activeElement).toBe(cancel); // the safe answer first
    // Tab and Shift+Tab stay inside the dialog
    await userEvent.tab();
    expect(document.activeElement).toBe(confirm);
    await userEvent.tab();
    expect(document.activeElement).toBe(cancel);
    await userEvent.tab({ shift: true });
    expect(document.activeElement).toBe(confirm);
    // Escape cancels: nothing sent, focus back on the button
    await userEvent.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(document.activeElement).toBe(approve);
    expect(approvals).toHaveLength(0);

    await userEvent.keyboard('{Enter}'); // the focused "Approve and release" opens it again
    const again = screen.getByRole('dialog', { name: 'Release fault-demo revision B?' });
    await userEvent.click(within(again).getByRole('button', { name: 'Release fault-demo B' }));
    await waitFor(() => expect(approvals).toEqual([{ comment: '' }]));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
  });

  it('the author sees what they submit on the Release page, and "first release" without an earlier one', async () => {
    serve({ rev: detail({ findings: reviewFindings, waivers: [everyBoardWaiver] }), summary: { ...summary, state: 'draft', changes: { since: null, added: [], removed: [], moved: [], changed: [], settings: [], overrides: [] } } });
    renderStage('release');
    expect(await screen.findByRole('region', { name: 'Submit' })).toBeTruthy();
    const s = await screen.findByRole('region', { name: 'What you submit' });
    await within(s).findByText(/First release/);
    expect(within(s).getByTestId('summary-kind-body-overlap').textContent).toMatch(/R1\/R2 are a stacked footprint by design/);
    expect(within(s).getByRole('table', { name: 'Overrides' }).textContent).toMatch(/C3/);
    // withdrawing asks in the same kind of dialog (no browser confirm box)
    await userEvent.click(screen.getByRole('button', { name: 'Withdraw' }));
    const dialog = screen.getByRole('dialog', { name: 'Withdraw fault-demo revision B?' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    expect(screen.queryByRole('dialog')).toBeNull();
  });
});

// ---- the override form: Cancel, and the filter kept ----------------------------------------------
describe('Assign: the override form', { timeout: 20_000 }, () => {
  it('has a Cancel, and saving an override keeps the table’s filter', async () => {
    const state = { rev: detail({ findings: null, findingsSummary: null, checkedAt: null }) };
    const puts: unknown[] = [];
    serve(state, (url, init) => {
      if (url === `/api/revisions/${REV}/overrides` && init?.method === 'PUT') {
        const body = JSON.parse(String(init.body));
        puts.push(body);
        state.rev = detail({ findings: null, findingsSummary: null, checkedAt: null, overrides: body.overrides, version: state.rev.version + 1 });
        return { status: 200, body: state.rev };
      }
      return undefined;
    });
    renderStage('assign');
    const filter = await screen.findByRole('searchbox', { name: 'Filter Placements' });
    await userEvent.type(filter, 'R1');
    const table = screen.getByRole('table', { name: 'Placements' });
    const r1 = () => within(table).getAllByText('R1')[0];
    await userEvent.click(r1());
    const form = screen.getByRole('region', { name: 'Override R1' });
    await userEvent.click(within(form).getByRole('button', { name: 'Cancel' }));
    expect(screen.queryByRole('region', { name: 'Override R1' })).toBeNull();
    expect(puts).toHaveLength(0);

    await userEvent.click(r1());
    const form2 = screen.getByRole('region', { name: 'Override R1' });
    await userEvent.selectOptions(within(form2).getByLabelText('Nozzle'), 'N07');
    await userEvent.type(within(form2).getByLabelText('Reason (kept with the revision)'), 'N05 tips wear fast');
    await userEvent.click(within(form2).getByRole('button', { name: 'Save override' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]).toMatchObject({ overrides: { R1: { nozzle: 'N07', reason: 'N05 tips wear fast' } }, version: 3 });
    // the revision comes back as version 4 and the table is run again: the filter stays
    await waitFor(() => expect(within(screen.getByRole('table', { name: 'Placements' })).getAllByText('override').length).toBeGreaterThan(0));
    expect((screen.getByRole('searchbox', { name: 'Filter Placements' }) as HTMLInputElement).value).toBe('R1');
    expect(screen.queryByRole('region', { name: 'Override R1' })).toBeNull();
  });
});

// ---- the package safeguard before a shared edit ---------------------------------------------------
describe('Library: a shared package edit shows where it is used and asks first', { timeout: 20_000 }, () => {
  const ID = '0b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11';
  const meta = { version: 4, updatedAt: T, updatedBy: 'lena@harrowcreek.example' };
  const pkg: PackageDto = { ...blankPackage('LED0603'), id: ID, ...meta, bodyLength: 1.6, bodyWidth: 0.8, aliases: [{ id: ID, pattern: 'LED-0603*', version: 1 }], warnings: [] };
  const nozzles: NozzleDto[] = [{ id: '1b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11', name: 'N05', tipOuter: 0.5, tipInner: 0.25, holderRadius: 2, notes: '', version: 1, updatedAt: T, updatedBy: null }];
  const usage = (inWork: boolean): PackageUsage => ({
    packageId: ID,
    packageName: 'LED0603',
    revisions: [
      ...(inWork ? [{ programId: PROG, programName: 'led-strip', revisionId: REV, label: 'B', state: 'draft' as const, parts: 7, viaOverride: 1, refs: ['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'R1'], affected: true }] : []),
      { programId: PROG, programName: 'led-strip', revisionId: '7a1f0c2e-4b1d-4c3e-9f00-0000000000bb', label: 'A', state: 'released' as const, parts: 6, viaOverride: 0, refs: ['D1', 'D2', 'D3', 'D4', 'D5', 'D6'], affected: false },
    ],
    inWork: inWork ? 1 : 0,
    released: 1,
  });

  function serveLibrary(inWork: boolean) {
    const puts: Record<string, unknown>[] = [];
    const calls = mockFetch((url, init) => {
      const method = init?.method ?? 'GET';
      if (url === '/api/auth/csrf') return { status: 200, body: { token: 'tok' } };
      if (url === '/api/me') return { status: 200, body: { user: { id: ID, email: 'lena@harrowcreek.example', name: 'Lena', roles: ['librarian'], active: true, lastSignInAt: null, createdAt: T, version: 1 } } };
      if (url === `/api/library/packages/${ID}` && method === 'PUT') {
        const body = JSON.parse(String(init!.body));
        puts.push(body);
        return { status: 200, body: { ...pkg, ...body, version: pkg.version + 1 } };
      }
      if (url === `/api/library/packages/${ID}`) return { status: 200, body: pkg };
      if (url === `/api/library/packages/${ID}/usage`) return { status: 200, body: usage(inWork) };
      if (url === '/api/library/nozzles') return { status: 200, body: { items: nozzles } };
      if (url === '/api/library/vision-presets') return { status: 200, body: { items: [] } };
      if (url.startsWith('/api/library/revisions')) return { status: 200, body: { items: [] } };
      if (url === '/api/library/packages' || url === '/api/library/proposals' || url === '/api/library/unmatched') return { status: 200, body: { items: [] } };
      return undefined;
    });
    return { puts, calls };
  }

  async function setRotation(value: string) {
    const f = await screen.findByRole('form', { name: 'Edit LED0603' });
    const rot = within(f).getByLabelText('Rotation offset', { exact: false });
    await userEvent.clear(rot);
    await userEvent.type(rot, value);
    return f;
  }

  it('lists the revisions in work and released before saving; released ones are said not to be affected', async () => {
    serveLibrary(true);
    renderRoutes([libraryRoute], `/library/packages/${ID}`);
    const panel = await screen.findByRole('region', { name: 'Where this package is used' });
    await waitFor(() => expect(within(panel).getAllByTestId('package-usage-row')).toHaveLength(2));
    expect(panel.textContent).toMatch(/led-strip rev B/);
    expect(panel.textContent).toMatch(/7 parts per board \(1 by override\): D1, D2, D3, D4, D5, D6, R1/);
    expect(panel.textContent).toMatch(/led-strip rev A.*not affected/);
  });

  it('asks before a change reaches a revision in work; "Keep editing" saves nothing, "Save the change" saves', async () => {
    const { puts } = serveLibrary(true);
    renderRoutes([libraryRoute], `/library/packages/${ID}`);
    const f = await setRotation('90');
    await userEvent.click(within(f).getByRole('button', { name: 'Save package' }));
    const dialog = await screen.findByRole('dialog', { name: 'Change LED0603 for 1 program revision in work?' });
    expect(dialog.textContent).toMatch(/led-strip rev B/);
    expect(dialog.textContent).toMatch(/1 released revision also uses it and is not affected/);
    expect(within(dialog).queryByText(/led-strip rev A/)).toBeNull(); // only the ones that change are listed
    await userEvent.click(within(dialog).getByRole('button', { name: 'Keep editing' }));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(puts).toHaveLength(0);
    expect((within(f).getByLabelText('Rotation offset', { exact: false }) as HTMLInputElement).value).toBe('90'); // the edit stays

    await userEvent.click(within(f).getByRole('button', { name: 'Save package' }));
    await userEvent.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Save the change' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]).toMatchObject({ rotationOffset: 90, version: 4 });
  });

  it('saves without asking when no revision in work uses it', async () => {
    const { puts } = serveLibrary(false);
    renderRoutes([libraryRoute], `/library/packages/${ID}`);
    const f = await setRotation('180');
    await userEvent.click(within(f).getByRole('button', { name: 'Save package' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(screen.queryByRole('dialog')).toBeNull();
  });

  it('approving a change proposal of a shared package asks the same way', async () => {
    const PID = '3b5d3c1e-8f3a-4f0e-9a51-2f8f4c0b1a11';
    const { aliases: _a, ...fields } = { ...blankPackage('LED0603'), bodyLength: 1.6, bodyWidth: 0.8, rotationOffset: 90 };
    const proposal = { id: PID, kind: 'change', status: 'open', proposerEmail: ellis.email, footprint: null, packageId: ID, packageName: 'LED0603', payload: { package: fields }, note: 'The reel turns them 90°', decidedByEmail: null, decidedAt: null, decisionComment: null, createdAt: T, version: 1 };
    const decisions: unknown[] = [];
    mockFetch((url, init) => {
      if (url === '/api/auth/csrf') return { status: 200, body: { token: 'tok' } };
      if (url === '/api/me') return { status: 200, body: { user: { id: ID, email: 'lena@harrowcreek.example', name: 'Lena', roles: ['librarian'], active: true, lastSignInAt: null, createdAt: T, version: 1 } } };
      if (url === '/api/library/proposals') return { status: 200, body: { items: [proposal] } };
      if (url === `/api/library/proposals/${PID}/approve` && init?.method === 'POST') {
        decisions.push(JSON.parse(String(init.body)));
        return { status: 200, body: { ...proposal, status: 'approved', decidedByEmail: 'lena@harrowcreek.example', decidedAt: T } };
      }
      if (url === `/api/library/packages/${ID}/usage`) return { status: 200, body: usage(true) };
      if (url === '/api/library/nozzles') return { status: 200, body: { items: nozzles } };
      if (url === '/api/library/vision-presets') return { status: 200, body: { items: [] } };
      if (url === '/api/library/packages' || url === '/api/library/unmatched') return { status: 200, body: { items: [] } };
      return undefined;
    });
    renderRoutes([libraryRoute], '/library/proposals');
    await userEvent.click(await screen.findByRole('button', { name: /LED0603/ }));
    const detailPanel = screen.getByRole('region', { name: 'Proposal LED0603' });
    await waitFor(() => expect(within(detailPanel).getAllByTestId('package-usage-row')).toHaveLength(2));
    await userEvent.click(within(detailPanel).getByRole('button', { name: 'Approve with these values' }));
    const dialog = await screen.findByRole('dialog', { name: 'Change LED0603 for 1 program revision in work?' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Keep editing' }));
    expect(decisions).toHaveLength(0);
    await userEvent.click(within(detailPanel).getByRole('button', { name: 'Approve with these values' }));
    await userEvent.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Save the change' }));
    await waitFor(() => expect(decisions).toHaveLength(1));
    expect(decisions[0]).toMatchObject({ package: { rotationOffset: 90 } });
  });

  it('a change of the notes alone reaches no placement', () => {
    const before = { ...blankPackage('LED0603'), notes: 'old' };
    const { aliases: _a, ...after } = before;
    expect(changesPlacement(before, { ...after, notes: 'new datasheet link' })).toBe(false);
    expect(changesPlacement(before, { ...after, rotationOffset: 90 })).toBe(true);
    expect(changesPlacement(before, { ...after, nozzles: ['N05'] })).toBe(true);
  });
});

