import { describe, expect, it } from 'vitest';
import { centreOn, fitView, panBy, scaleBarLength, screenToWorld, visibleWorldBox, worldToScreen, zoomAbout } from '../../../shared/canvas';

describe('view transform', () => {
  const v = { s: 4, ox: 100, oy: 500 };

  it.each([
    // screenX = 100 + 4·10 = 140; screenY = 500 − 4·20 = 420 (Y up becomes Y down)
    [10, 20, 140, 420],
    [0, 0, 100, 500],
    // x −25 → 100 − 100 = 0; y 125 → 500 − 500 = 0: the screen's top-left corner
    [-25, 125, 0, 0],
  ])('world (%d, %d) → screen (%d, %d) and back', (x, y, sx, sy) => {
    expect(worldToScreen(v, x, y)).toEqual({ x: sx, y: sy });
    expect(screenToWorld(v, sx, sy)).toEqual({ x, y });
  });

  it('round trips random points within 1e-9', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let k = 0; k < 200; k++) {
      const view = { s: 0.1 + rnd() * 100, ox: rnd() * 2000 - 1000, oy: rnd() * 2000 - 1000 };
      const x = rnd() * 800 - 400, y = rnd() * 800 - 400;
      const s = worldToScreen(view, x, y);
      const w = screenToWorld(view, s.x, s.y);
      expect(w.x).toBeCloseTo(x, 9);
      expect(w.y).toBeCloseTo(y, 9);
    }
  });

  it('fits a 220 × 100 mm panel into 1000 × 600 px with a 50 px margin', () => {
    // s = min(900 / 220, 500 / 100) = min(4.0909…, 5) = 4.0909…; centre (110, 50) → (500, 300)
    const f = fitView({ minX: 0, minY: 0, maxX: 220, maxY: 100 }, 1000, 600, 50);
    expect(f.s).toBeCloseTo(900 / 220, 12);
    expect(worldToScreen(f, 110, 50).x).toBeCloseTo(500, 9);
    expect(worldToScreen(f, 110, 50).y).toBeCloseTo(300, 9);
    // the lower-left corner is at the bottom-left of the fitted area: x = 50, y = 300 + 50·4.0909 = 504.5…
    expect(worldToScreen(f, 0, 0).x).toBeCloseTo(50, 9);
    expect(worldToScreen(f, 0, 0).y).toBeCloseTo(300 + 50 * (900 / 220), 9);
    const box = visibleWorldBox(f, 1000, 600);
    expect(box.minX).toBeLessThan(0);
    expect(box.maxX).toBeGreaterThan(220);
  });

  it('zooms about the cursor: the world point under it stays put', () => {
    const before = screenToWorld(v, 321, 123);
    const z = zoomAbout(v, 321, 123, 2.5);
    expect(z.s).toBe(10);
    const after = screenToWorld(z, 321, 123);
    expect(after.x).toBeCloseTo(before.x, 9);
    expect(after.y).toBeCloseTo(before.y, 9);
  });

  it('pans and centres', () => {
    expect(panBy(v, 5, -7)).toEqual({ s: 4, ox: 105, oy: 493 });
    const c = centreOn(v, 10, 10, 800, 600);
    expect(worldToScreen(c, 10, 10)).toEqual({ x: 400, y: 300 });
  });

  it.each([
    // 120 px at 4 px/mm = 30 mm → 20 mm; at 1 px/mm 120 mm → 100 mm; at 50 px/mm 2.4 mm → 2 mm;
    // at 300 px/mm 0.4 mm → 0.2 mm
    [4, 20],
    [1, 100],
    [50, 2],
    [300, 0.2],
  ])('scale bar at %d px/mm is %d mm', (s, len) => {
    expect(scaleBarLength(s, 120)).toBeCloseTo(len, 12);
  });
});
