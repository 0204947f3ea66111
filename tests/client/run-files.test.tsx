import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { RunFileDto } from '../../shared/schemas/program.schema';
import type { SetupSheetDto, SetupSheetPlacement } from '../../shared/schemas/run-file.schema';
import RunFilesRoute from '../../src/app/routes/run-files/index';
import SetupSheetRoute from '../../src/app/routes/run-files/setup-sheet';
import { orderRunFiles } from '../../src/features/run-files/lib/order';
import { groupParts, nozzleCounts, perBoardText, visionCounts } from '../../src/features/run-files/lib/setup-sheet';
import { fileSize } from '../../src/features/run-files/lib/format';
import { mockFetch, renderRoutes } from '../helpers/render';

// ---- a hand-made list: a 3-board panel (board 2 carries no C3: a do-not-place variant) -------------
let seq = 0;
const part = (board: number, ref: string, pkg: string | null, value: string, partNumber: string, nozzle: string | null, vision: string | null): SetupSheetPlacement => ({
  seq: ++seq, board, ref, x: 10 * board, y: 5, rotation: 0, package: pkg, nozzle, vision, height: 0.5, partNumber, value,
});
const boardParts = (b: number) => [
  part(b, 'R1', 'R0603', '10k', 'HCI-R-10K', 'N07', 'chip-small'),
  part(b, 'R2', 'R0603', '10k', 'HCI-R-10K', 'N07', 'chip-small'),
  part(b, 'R10', 'R0603', '4k7', 'HCI-R-4K7', 'N07', 'chip-small'),
  part(b, 'C1', 'C0603', '100n', 'HCI-C-100N', 'N07', 'chip-small'),
  part(b, 'C2', 'C0603', '100n', 'HCI-C-100N-B', 'N07', 'chip-small'),
  ...(b === 2 ? [] : [part(b, 'C3', 'C0603', '100n', 'HCI-C-100N', 'N07', 'chip-small')]),
  part(b, 'U1', 'SOIC-8', 'HC-AMP', 'HCI-U-AMP', 'N14', 'lead-row'),
  part(b, 'J1', null, 'HDR-4', 'HCI-J-4', null, null),
];
const placements = [1, 2, 3].flatMap(boardParts);

describe('set-up sheet grouping', () => {
  const groups = groupParts(placements);
  const find = (pkg: string, value: string) => groups.find((g) => g.package === pkg && g.value === value)!;

  it('groups by package and value, sorted, with counts per panel and per board', () => {
    expect(groups.map((g) => `${g.package} ${g.value}`)).toEqual(['(no package) HDR-4', 'C0603 100n', 'R0603 4k7', 'R0603 10k', 'SOIC-8 HC-AMP']);
    // R0603 10k: R1 + R2 on each of 3 boards = 2 × 3 = 6 per panel, 2 per board
    expect(find('R0603', '10k')).toMatchObject({ perPanel: 6, perBoard: { min: 2, max: 2 }, partNumbers: ['HCI-R-10K'], refs: ['R1', 'R2'] });
    // R0603 4k7: R10 on each board = 1 × 3 = 3
    expect(find('R0603', '4k7')).toMatchObject({ perPanel: 3, perBoard: { min: 1, max: 1 } });
    // C0603 100n: C1, C2, C3 on boards 1 and 3 (3 each) + C1, C2 on board 2 (2) = 3 + 2 + 3 = 8; per board 2–3
    expect(find('C0603', '100n')).toMatchObject({ perPanel: 8, perBoard: { min: 2, max: 3 }, partNumbers: ['HCI-C-100N', 'HCI-C-100N-B'], refs: ['C1', 'C2', 'C3'] });
    expect(perBoardText(find('C0603', '100n'))).toBe('2–3');
    expect(perBoardText(find('R0603', '10k'))).toBe('2');
    // a part without a library package is still counted, under its own heading: 1 × 3 = 3
    expect(find('(no package)', 'HDR-4')).toMatchObject({ perPanel: 3, nozzle: null, vision: null });
    // every placement lands in exactly one group: 6 + 3 + 8 + 3 + 3 = 23 = 8 + 7 + 8 placements
    expect(groups.reduce((n, g) => n + g.perPanel, 0)).toBe(placements.length);
    expect(placements.length).toBe(23);
  });

  it('counts nozzles and vision presets over the panel', () => {
    // N07: R1 R2 R10 C1 C2 (5) on each board + C3 on boards 1 and 3 = 15 + 2 = 17; N14: U1 × 3 = 3; J1 has none
    expect(nozzleCounts(placements)).toEqual([{ name: 'N07', count: 17 }, { name: 'N14', count: 3 }]);
    expect(visionCounts(placements)).toEqual([{ name: 'chip-small', count: 17 }, { name: 'lead-row', count: 3 }]);
  });

  it('sizes files in decimal units', () => {
    expect([fileSize(812), fileSize(14_180), fileSize(1_300_000)]).toEqual(['812 B', '14.2 kB', '1.3 MB']);
  });
});

// ---- run files: superseded marking ---------------------------------------------------------------
const sha = (c: string) => c.repeat(64);
const rf = (over: Partial<RunFileDto> & Pick<RunFileDto, 'revisionId' | 'label' | 'state' | 'releasedAt'>): RunFileDto => ({
  programId: 'p-strip',
  programName: 'led-strip',
  product: 'LED status strip',
  board: 'HCI-LS2 rev A',
  author: { id: 'u1', name: 'Ellis Marsh', email: 'ellis@harrowcreek.example' },
  reviewer: { id: 'u2', name: 'Rowan Pike', email: 'rowan@harrowcreek.example' },
  files: [
    { side: 'top', format: 'csv', sha256: sha(over.label === 'B' ? 'b' : 'a'), placements: 240, bytes: 14_180, url: `/api/run-files/${over.revisionId}/top.csv` },
    { side: 'top', format: 'json', sha256: sha('c'), placements: 240, bytes: 40_112, url: `/api/run-files/${over.revisionId}/top.json` },
  ],
  ...over,
});
// As the server sends them: newest release first, over all programs.
const LIST: RunFileDto[] = [
  rf({ revisionId: 'r-ws-a', label: 'A', state: 'released', releasedAt: '2026-11-30T09:00:00.000Z', programId: 'p-ws', programName: 'weather-station', product: 'Weather-station controller', board: 'HCI-WS1 rev C' }),
  rf({ revisionId: 'r-c', label: 'C', state: 'released', releasedAt: '2026-11-20T09:00:00.000Z' }),
  rf({ revisionId: 'r-b', label: 'B', state: 'superseded', releasedAt: '2026-11-10T09:00:00.000Z' }),
  rf({ revisionId: 'r-a', label: 'A', state: 'superseded', releasedAt: '2026-11-01T09:00:00.000Z' }),
];

describe('run files order', () => {
  it('puts programs with the latest release first, the current revision first, and names what replaced each superseded one', () => {
    const programs = orderRunFiles(LIST);
    expect(programs.map((p) => p.programName)).toEqual(['weather-station', 'led-strip']);
    expect(programs[1].entries.map((e) => [e.runFile.label, e.current, e.supersededBy])).toEqual([
      ['C', true, null],
      ['B', false, 'C'],
      ['A', false, 'B'],
    ]);
  });
});

describe('Run files page', () => {
  it('shows the empty state when nothing is released', async () => {
    mockFetch((url) => (url === '/api/run-files' ? { status: 200, body: { items: [] } } : undefined));
    renderRoutes([{ path: '/run-files', element: <RunFilesRoute /> }], '/run-files');
    expect(await screen.findByText('No released programs yet — when an engineer releases a program, its run files appear here.')).toBeTruthy();
    expect(screen.getByRole('complementary', { name: 'Safety' }).textContent).toMatch(/lead/);
  });

  it('marks superseded revisions (muted, "superseded by …") after the current one, with full checksums', async () => {
    mockFetch((url) => (url === '/api/run-files' ? { status: 200, body: { items: LIST } } : undefined));
    renderRoutes([{ path: '/run-files', element: <RunFilesRoute /> }], '/run-files');
    const strip = await screen.findByRole('region', { name: 'Program led-strip' });
    const cards = within(strip).getAllByRole('article');
    expect(cards.map((c) => c.getAttribute('aria-label'))).toEqual(['led-strip C (current)', 'led-strip B (superseded)', 'led-strip A (superseded)']);
    expect(cards[0].className).not.toMatch(/text-ink-500/);
    expect(cards[1].className).toMatch(/bg-ink-50 text-ink-500/);
    expect(within(cards[1]).getByText(/superseded by/).textContent).toBe('superseded by C — do not load');
    expect(within(cards[2]).getByText(/superseded by/).textContent).toMatch(/superseded by B/);
    // the SHA-256 in full (64 hex digits), in the mono font, with a copy button
    const hash = within(cards[0]).getByText(sha('a'));
    expect(hash.className).toMatch(/\bnum\b/);
    expect(within(cards[0]).getByRole('button', { name: 'Copy the SHA-256 of the Top CSV of led-strip C' })).toBeTruthy();
    const dl = within(cards[0]).getByRole('link', { name: 'Download Top CSV of led-strip C' });
    expect(dl.getAttribute('href')).toBe('/api/run-files/r-c/top.csv');
    expect(dl.hasAttribute('download')).toBe(true);
    expect(within(cards[0]).getByText('14.2 kB')).toBeTruthy();
    expect(within(cards[0]).getAllByText('240')).toHaveLength(2);
  });

  it('reports a problem: the error beside the field, then a toast', async () => {
    const calls = mockFetch((url) => {
      if (url === '/api/run-files') return { status: 200, body: { items: LIST } };
      if (url === '/api/auth/csrf') return { status: 200, body: { token: 'tok' } };
      if (url === '/api/run-files/r-c/problems') return { status: 201, body: { ok: true } };
      return undefined;
    });
    renderRoutes([{ path: '/run-files', element: <RunFilesRoute /> }], '/run-files');
    const card = await screen.findByRole('article', { name: 'led-strip C (current)' });
    await userEvent.click(within(card).getByRole('button', { name: 'Report a problem' }));
    const form = within(card).getByRole('form', { name: 'Report a problem with led-strip C' });
    const field = within(form).getByLabelText('What went wrong?');
    await userEvent.type(field, 'skewed');
    await userEvent.click(within(form).getByRole('button', { name: 'Send report' }));
    expect(await within(form).findByText('Describe the problem (at least 10 characters)')).toBeTruthy();
    expect(field.getAttribute('aria-invalid')).toBe('true');
    expect(calls.some((c) => c.url.endsWith('/problems'))).toBe(false);
    await userEvent.type(field, ': D3 sits 0.4 mm left of its pads');
    await userEvent.click(within(form).getByRole('button', { name: 'Send report' }));
    expect(await screen.findByText(/the author of led-strip C has been told/)).toBeTruthy();
    const sent = calls.find((c) => c.url.endsWith('/problems'))!;
    expect(JSON.parse(String(sent.init?.body))).toEqual({ text: 'skewed: D3 sits 0.4 mm left of its pads' });
    await waitFor(() => expect(within(card).queryByRole('form')).toBeNull());
  });
});

describe('set-up sheet page', () => {
  it('shows program, checksums, machine, fiducials in mm with 3 decimals, nozzles and parts', async () => {
    const sheet: SetupSheetDto = {
      program: { id: 'p-strip', name: 'led-strip', product: 'LED status strip', board: 'HCI-LS2 rev A' },
      revision: { id: 'r-c', label: 'C', state: 'released', releasedAt: '2026-11-20T09:00:00.000Z' },
      machine: { name: 'HC line B (desktop)', reachX: 400, reachY: 400, nozzles: ['N07', 'N10'] },
      sides: [
        {
          side: 'top',
          sha256: sha('c'),
          list: {
            format: 'placewright-placement-list/1',
            meta: { program: 'led-strip', revision: 'C', side: 'top', units: 'mm', frame: 'machine', boards: 3, placements: 23, generated: '2026-11-20T09:00:00.000Z' },
            fiducials: [{ name: 'PT1', x: 4.00049, y: 3.9996 }],
            placements,
          },
        },
      ],
    };
    mockFetch((url) => {
      if (url === '/api/run-files') return { status: 200, body: { items: LIST } };
      if (url === '/api/run-files/r-c/setup-sheet') return { status: 200, body: sheet };
      return undefined;
    });
    renderRoutes([{ path: '/run-files/:revisionId/setup-sheet', element: <SetupSheetRoute /> }], '/run-files/r-c/setup-sheet');
    expect(await screen.findByRole('heading', { level: 1, name: 'led-strip C' })).toBeTruthy();
    expect(await screen.findByText(sha('a'))).toBeTruthy(); // the CSV checksum, from the run-file list
    const fid = screen.getByRole('table', { name: 'Top fiducials' });
    // 4.00049 → "4.000 mm", 3.9996 → "4.000 mm" (3 decimals)
    expect(within(fid).getAllByText('4.000 mm')).toHaveLength(2);
    const nozzles = screen.getByRole('table', { name: 'Top nozzles' });
    expect(within(nozzles).getByText('17')).toBeTruthy();
    expect(within(nozzles).getByText('not on the machine')).toBeTruthy(); // N14 is not among N07, N10
    const parts = screen.getByRole('table', { name: 'Top parts' });
    const row = within(parts).getByText('100n').closest('tr')!;
    expect(within(row).getByText('2–3')).toBeTruthy();
    expect(within(row).getByText('8')).toBeTruthy();
    expect(screen.getByText('Machine profile').closest('section')!.textContent).toMatch(/400 mm × 400 mm/);
    expect(screen.getByRole('button', { name: 'Print' })).toBeTruthy();
  });
});
