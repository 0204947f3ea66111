import { act, fireEvent, render, screen, within } from '@testing-library/react';
import { readFileSync } from 'node:fs';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { runRevision } from '../../shared/engine';
import type { RunResult, Side } from '../../shared/core';
import { jobSchema } from '../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { PanelCanvas, PanelReview, type NewNote } from '../../src/features/canvas';

function faultyRuns() {
  const job = jobSchema.parse(JSON.parse(readFileSync('samples/faulty/job.json', 'utf8')));
  const library = libraryFileSchema.parse(JSON.parse(readFileSync('samples/library.json', 'utf8')));
  const csv = readFileSync('samples/faulty/faulty.csv', 'utf8');
  const runs = {} as Record<Side, RunResult>;
  const run = runRevision({ job, centroidText: csv, library, sides: 'both' });
  for (const r of run.runs) runs[r.side] = r;
  return { runs, findings: run.check!.findings };
}
const { runs, findings } = faultyRuns();

const placementRows = () => within(screen.getByRole('table', { name: 'Placements' })).queryAllByRole('row').filter((r) => r.hasAttribute('data-row-id'));
const row = (id: string) => placementRows().find((r) => r.getAttribute('data-row-id') === id);
const frame = () => act(() => new Promise<void>((r) => requestAnimationFrame(() => r())));

function Harness(props: { onToggle?: (k: string[], c: boolean) => void; onNote?: (n: NewNote) => void }) {
  const [checked, setChecked] = useState<ReadonlySet<string>>(new Set());
  return (
    <PanelReview
      runs={runs}
      findings={findings}
      checkedFindingKeys={checked}
      onToggleChecked={(keys, on) => {
        props.onToggle?.(keys, on);
        setChecked((prev) => {
          const n = new Set(prev);
          for (const k of keys) if (on) n.add(k); else n.delete(k);
          return n;
        });
      }}
      comments={[{ id: 'c1', side: 'top', x: 20, y: 20, text: 'Check C4 polarity against the photo', author: 'Rowan' }]}
      onAddComment={props.onNote}
      canvasHeight={400}
    />
  );
}

describe('PanelReview', () => {
  it('renders the canvas, the side and frame, the layers and both tables', async () => {
    render(<Harness />);
    await frame();
    expect(screen.getByRole('application', { name: /Panel canvas: Top side, seen from above/ })).toHaveProperty('tabIndex', 0);
    expect(screen.getByTestId('side-badge').textContent).toMatch(/Top side · seen from above.*panel frame/);
    expect(screen.getByRole('radio', { name: 'Top (from above)' }).getAttribute('aria-checked')).toBe('true');
    expect(within(screen.getByRole('group', { name: 'Layers' })).getAllByRole('checkbox')).toHaveLength(9); // no underlay yet
    expect(screen.getByRole('table', { name: 'Findings' })).toBeTruthy();
    expect(screen.getByRole('region', { name: 'Comments' }).textContent).toMatch(/Check C4 polarity/);
    expect(screen.getByRole('img', { name: /Scale bar: \d+ mm/ })).toBeTruthy();
  });

  it('layer checkboxes and number keys toggle the same layers', async () => {
    render(<Harness />);
    await frame();
    const layers = screen.getByRole('group', { name: 'Layers' });
    const courtyards = within(layers).getByRole('checkbox', { name: /Courtyards/ }) as HTMLInputElement;
    expect(courtyards.checked).toBe(false);
    fireEvent.click(courtyards);
    expect(courtyards.checked).toBe(true);
    const canvas = screen.getByTestId('panel-canvas');
    fireEvent.keyDown(canvas, { key: '4' });
    expect(courtyards.checked).toBe(false);
    const bodies = within(layers).getByRole('checkbox', { name: /Bodies/ }) as HTMLInputElement;
    fireEvent.keyDown(canvas, { key: '3' });
    expect(bodies.checked).toBe(false);
  });

  it('a placement row selects the part and its findings; Esc on the canvas clears', async () => {
    render(<Harness />);
    await frame();
    fireEvent.click(row('1:R1')!);
    expect(row('1:R1')!.getAttribute('aria-selected')).toBe('true');
    expect(screen.getByTestId('panel-canvas').dataset.selection).toBe('1:R1');
    const selectedFindings = within(screen.getByRole('table', { name: 'Findings' })).getAllByRole('row').filter((r) => r.getAttribute('aria-selected') === 'true');
    expect(selectedFindings).toHaveLength(1);
    expect(selectedFindings[0].textContent).toMatch(/body-overlap.*1:R1, 1:R2/);
    fireEvent.keyDown(screen.getByTestId('panel-canvas'), { key: 'Escape' });
    expect(row('1:R1')!.getAttribute('aria-selected')).toBe('false');
  });

  it('a finding row selects its parts; its checkbox marks it checked', async () => {
    const onToggle = vi.fn();
    render(<Harness onToggle={onToggle} />);
    await frame();
    const table = screen.getByRole('table', { name: 'Findings' });
    const fRow = within(table).getAllByRole('row').find((r) => /nozzle-shadow.*1:C3, 1:C4/.test(r.textContent ?? ''))!;
    fireEvent.click(fRow);
    expect(screen.getByTestId('panel-canvas').dataset.selection!.split(' ').sort()).toEqual(['1:C3', '1:C4']);
    fireEvent.click(within(fRow).getByRole('checkbox'));
    expect(onToggle).toHaveBeenCalledWith([fRow.getAttribute('data-row-id')], true);
    expect(screen.getByText(/findings on this side · 1 checked/)).toBeTruthy();
    // the selection toolbar offers to mark the selected findings
    fireEvent.click(screen.getByRole('button', { name: /Untick: 1 selected finding/ }));
    expect(onToggle).toHaveBeenLastCalledWith([fRow.getAttribute('data-row-id')], false);
  });

  it('filters narrow the findings table by kind', async () => {
    render(<Harness />);
    await frame();
    fireEvent.change(screen.getByLabelText('Finding kind'), { target: { value: 'off-board' } });
    const rows = within(screen.getByRole('table', { name: 'Findings' })).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.textContent)).toEqual([expect.stringMatching(/off-board.*1:R3/), expect.stringMatching(/off-board.*2:R3/)]);
  });

  it('the bottom side says it is seen from below', async () => {
    render(<Harness />);
    await frame();
    fireEvent.click(screen.getByRole('radio', { name: 'Bottom (from below)' }));
    await frame();
    expect(screen.getByTestId('side-badge').textContent).toMatch(/Bottom side · seen from below.*bottom panel frame/);
    expect(placementRows().map((r) => r.getAttribute('data-row-id')).sort()).toEqual(['1:C10', '1:R10', '2:C10', '2:R10']);
  });

  it('tools: measure and comment are buttons with their state, and "?" lists the keys', async () => {
    render(<Harness onNote={() => {}} />);
    await frame();
    const measure = screen.getByRole('button', { name: 'Measure' });
    fireEvent.click(measure);
    expect(measure.getAttribute('aria-pressed')).toBe('true');
    expect(screen.getByRole('status', { name: 'Measurement' }).textContent).toMatch(/Click a first point/);
    fireEvent.keyDown(screen.getByTestId('panel-canvas'), { key: 'Escape' });
    expect(measure.getAttribute('aria-pressed')).toBe('false');
    fireEvent.click(screen.getByRole('button', { name: 'Keyboard shortcuts' }));
    const help = screen.getByRole('dialog', { name: 'Keyboard shortcuts' });
    expect(help.textContent).toMatch(/fit the panel/);
    expect(help.textContent).toMatch(/show \/ hide courtyards/);
  });
});

describe('PanelCanvas alone', () => {
  it('draws with a private store and reports its draws', async () => {
    const onDraw = vi.fn();
    render(<PanelCanvas run={runs.top} findings={findings} height={300} onDraw={onDraw} />);
    await frame();
    await frame();
    expect(onDraw).toHaveBeenCalled();
    expect(onDraw.mock.calls[0][0].layers).toEqual(['underlay', 'base', 'bodies', 'overlay']);
    expect(screen.getByTestId('panel-canvas').dataset.view).toMatch(/^[\d.]+,[-\d.]+,[-\d.]+$/);
  });
});
