// Canvas benchmark page: mounts the real PanelCanvas on a seeded 50,000-part panel (or on its
// outline only, `?mode=floor`), then scripts a pan and a zoom and reports the figures on
// `window.__bench` for tests/bench/canvas.bench.ts to read.
import { createRoot } from 'react-dom/client';
import { CanvasStore, DEFAULT_LAYERS, PanelCanvas, PanelReview, type DrawStats, type LayerId } from '../../../src/features/canvas';
import { verifyInputFromRuns } from '../../../shared/verify';
import { verify } from '../../../shared/verify';
import { outlineOnly, syntheticRun } from './panel';

declare global {
  interface Window {
    __bench?: { mode: string; parts: number; findings: number; firstDrawMs?: number; frames?: number[]; drawMs?: number[]; error?: string };
  }
}

const params = new URLSearchParams(location.search);
const mode = params.get('mode') ?? 'full';
// `?layers=bodies,panel` shows only those layers (for looking into the figures)
const only = params.get('layers');
const store = new CanvasStore(
  only ? { layers: Object.fromEntries(Object.keys(DEFAULT_LAYERS).map((k) => [k, only.split(',').includes(k)])) as Record<LayerId, boolean> } : {},
);
const full = syntheticRun();
const tv = performance.now();
const findings = mode === 'full' ? verify(verifyInputFromRuns([full]), { limit: 20000 }).findings : [];
const run = mode === 'full' ? full : outlineOnly(full);
const bench: NonNullable<Window['__bench']> = { mode, parts: run.placements.count, findings: findings.length, verifyMs: performance.now() - tv } as NonNullable<Window['__bench']>;
window.__bench = bench;

const draws: number[] = [];
let t0 = 0;
let scripting = false;
const onDraw = (s: DrawStats) => {
  if (bench.firstDrawMs === undefined && s.layers.includes('bodies')) {
    bench.firstDrawMs = performance.now() - t0;
    setTimeout(script, 300);
  }
  if (scripting) draws.push(s.ms);
  if (params.has('log')) console.log(`draw ${s.layers.join('+')} ${s.ms.toFixed(1)} ms`);
};

function frame(): Promise<number> {
  return new Promise((r) => requestAnimationFrame(r));
}

async function script() {
  const el = document.querySelector('[data-testid=panel-canvas]') as HTMLElement;
  const r = el.getBoundingClientRect();
  const cx = r.left + r.width / 2, cy = r.top + r.height / 2;
  const fire = (type: string, x: number, y: number) =>
    el.dispatchEvent(new PointerEvent(type, { bubbles: true, clientX: x, clientY: y, pointerId: 1, button: 0, buttons: 1, isPrimary: true }));
  const times: number[] = [];
  scripting = true;
  let last = await frame();
  // pan: a drag of 120 frames, 6 px per frame to the right and 3 px up
  fire('pointerdown', cx, cy);
  for (let k = 1; k <= 120; k++) {
    fire('pointermove', cx + 6 * k, cy - 3 * k);
    const t = await frame();
    times.push(t - last);
    last = t;
  }
  fire('pointerup', cx + 720, cy - 360);
  // zoom: 60 wheel steps in about a point, then 60 out
  for (let k = 0; k < 120; k++) {
    el.dispatchEvent(new WheelEvent('wheel', { bubbles: true, cancelable: true, clientX: cx - 100, clientY: cy + 50, deltaY: k < 60 ? -60 : 60 }));
    const t = await frame();
    times.push(t - last);
    last = t;
  }
  scripting = false;
  bench.frames = times;
  bench.drawMs = draws;
}

window.addEventListener('error', (e) => (bench.error = String(e.message)));
t0 = performance.now();
// `?ui=review` mounts the whole review (canvas, tables, controls) instead of the canvas alone
createRoot(document.getElementById('root')!).render(
  params.get('ui') === 'review' ? (
    <PanelReview runs={{ top: run }} findings={findings} canvasHeight={760} onDraw={onDraw} />
  ) : (
    <PanelCanvas store={store} run={run} findings={findings} height={760} onDraw={onDraw} />
  ),
);
