// The canvas schedules its draws on animation frames. React's StrictMode (on in development builds)
// mounts every component twice: effects run, are cleaned up and run again. The frame scheduling
// must survive that, or the canvas paints once and never again.
import { act, fireEvent, render, screen } from '@testing-library/react';
import { readFileSync } from 'node:fs';
import { StrictMode } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { runJob } from '../../shared/pipeline';
import { jobSchema } from '../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { PanelCanvas } from '../../src/features/canvas';

const job = jobSchema.parse(JSON.parse(readFileSync('samples/faulty/job.json', 'utf8')));
const library = libraryFileSchema.parse(JSON.parse(readFileSync('samples/library.json', 'utf8')));
const run = runJob({ job, centroidText: readFileSync('samples/faulty/faulty.csv', 'utf8'), library, side: 'top' });
const frame = () => act(() => new Promise<void>((r) => requestAnimationFrame(() => r())));

describe.each([
  ['without StrictMode', false],
  ['under StrictMode (double mount)', true],
])('PanelCanvas %s', (_name, strict) => {
  it('draws again after a zoom, a pan and a layer toggle', async () => {
    const onDraw = vi.fn();
    const canvas = <PanelCanvas run={run} findings={[]} height={300} onDraw={onDraw} />;
    render(strict ? <StrictMode>{canvas}</StrictMode> : canvas);
    await frame();
    await frame();
    expect(onDraw).toHaveBeenCalled();
    const el = screen.getByTestId('panel-canvas');
    const drawsAfter = async (what: () => void) => {
      onDraw.mockClear();
      act(what);
      await frame();
      await frame();
      return onDraw.mock.calls.flatMap((c) => c[0].layers as string[]);
    };
    // zoom (the + key), pan (an arrow key), a layer (key 2: boards)
    expect(await drawsAfter(() => fireEvent.keyDown(el, { key: '+' }))).toContain('bodies');
    expect(await drawsAfter(() => fireEvent.keyDown(el, { key: 'ArrowLeft' }))).toContain('base');
    expect(await drawsAfter(() => fireEvent.keyDown(el, { key: '2' }))).toContain('base');
    // the wheel too
    expect(
      await drawsAfter(() => {
        el.dispatchEvent(new WheelEvent('wheel', { deltaY: -200, clientX: 50, clientY: 50, bubbles: true, cancelable: true }));
      }),
    ).toContain('bodies');
  });
});
