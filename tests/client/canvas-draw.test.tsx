// The draw functions against a recording 2-D context: what reaches the canvas, in which frame.
import { describe, expect, it } from 'vitest';
import { allocatePlacementColumns } from '../../shared/core';
import type { Quad, RunResult } from '../../shared/core';
import { drawBase, drawBodies, drawOverlay } from '../../src/features/canvas/draw';
import { buildScene } from '../../src/features/canvas/scene';
import { DEFAULT_LAYERS } from '../../src/features/canvas/store';

type Call = [string, ...unknown[]];
function recorder() {
  const calls: Call[] = [];
  const ctx = new Proxy({} as Record<string, unknown>, {
    get(target, prop: string) {
      if (prop in target) return target[prop];
      if (prop === 'measureText') return (t: string) => ({ width: t.length * 6 });
      return (...args: unknown[]) => calls.push([prop, ...args]);
    },
    set(target, prop: string, value) {
      target[prop] = value;
      calls.push([`set:${prop}`, value]);
      return true;
    },
  });
  return { ctx: ctx as unknown as CanvasRenderingContext2D, calls };
}

const rect = (x: number, y: number, w: number, h: number): Quad => [{ x, y }, { x: x + w, y }, { x: x + w, y: y + h }, { x, y: y + h }];

function smallRun(): RunResult {
  const p = allocatePlacementColumns(2);
  p.ref[0] = 'U1'; p.board[0] = 1; p.x[0] = 10; p.y[0] = 10; p.rotation[0] = 180; p.bodyLength[0] = 4.9; p.bodyWidth[0] = 3.9; p.packageName[0] = 'SOIC-8';
  p.ref[1] = 'R1'; p.board[1] = 1; p.x[1] = 20; p.y[1] = 10; p.rotation[1] = 0; p.bodyLength[1] = 1.6; p.bodyWidth[1] = 0.8; p.packageName[1] = 'R0603';
  return {
    side: 'top', frame: 'panel', program: null, revision: null, placements: p,
    boards: [
      { number: 1, anchor: { x: 5, y: 5 }, rotation: 0, skipped: false, outline: rect(5, 5, 30, 20), localTransform: false },
      { number: 2, anchor: { x: 40, y: 5 }, rotation: 0, skipped: true, outline: rect(40, 5, 30, 20), localTransform: false },
    ],
    boardsPlaced: 1,
    board: { width: 30, height: 20, originX: 0, originY: 0 },
    panel: { width: 75, height: 30, outline: rect(0, 0, 75, 30), flipAxis: 'vertical' },
    fiducials: [], transform: null, boardTransforms: [], unmatched: [], machine: { name: null, reachX: 400, reachY: 400, nozzles: [] },
    import: { placements: [], columns: {}, units: 'mm', dialect: { delimiter: ',', decimalComma: false, headerLine: 1, bom: false, lineEnding: '\n', unitsSource: 'option', dnpSense: null }, headers: [], warnings: [] },
    warnings: [],
  };
}

const vp = { view: { s: 10, ox: 20, oy: 400 }, width: 800, height: 420 };

describe('drawing', () => {
  const scene = buildScene(smallRun(), []);

  it('world drawing runs under a Y-flipping transform (s, 0, 0, −s, ox, oy)', () => {
    const { ctx, calls } = recorder();
    drawBase(ctx, scene, vp, DEFAULT_LAYERS);
    expect(calls.find((c) => c[0] === 'transform')).toEqual(['transform', 10, 0, 0, -10, 20, 400]);
  });

  it('a skipped board is crossed by its two diagonals and labelled', () => {
    const { ctx, calls } = recorder();
    drawBase(ctx, scene, vp, DEFAULT_LAYERS);
    const moves = calls.filter((c) => c[0] === 'moveTo' || c[0] === 'lineTo').map((c) => `${c[0]} ${c[1]},${c[2]}`);
    // board 2: corners (40,5) (70,5) (70,25) (40,25); diagonals (40,5)→(70,25) and (70,5)→(40,25)
    const s = moves.join(' | ');
    expect(s).toContain('moveTo 40,5 | lineTo 70,25 | moveTo 70,5 | lineTo 40,25');
    expect(calls.some((c) => c[0] === 'fillText' && c[1] === '2 skipped')).toBe(true);
    // text in screen space, upright: board 1's number at its centre (20, 15) → (20 + 10·20, 400 − 10·15)
    expect(calls.find((c) => c[0] === 'fillText' && c[1] === '1')).toEqual(['fillText', '1', 220, 250]);
  });

  it('bodies go into one batched path per colour, turned with the part', () => {
    const { ctx, calls } = recorder();
    drawBodies(ctx, scene, vp, DEFAULT_LAYERS, null);
    expect(calls.filter((c) => c[0] === 'fill')).toHaveLength(2); // bodies, then pin-1 marks
    // U1 at 180°: its first corner is the zero-orientation lower-left (−2.45, −1.95) turned by a
    // half turn → (10 + 2.45, 10 + 1.95)
    const first = calls.find((c) => c[0] === 'moveTo')!;
    expect(first[1]).toBeCloseTo(12.45, 9);
    expect(first[2]).toBeCloseTo(11.95, 9);
  });

  it('labels only when they fit: at 10 px/mm the SOIC-8 gets one, the R0603 not', () => {
    const { ctx, calls } = recorder();
    drawOverlay(ctx, scene, vp, {
      layers: DEFAULT_LAYERS, selected: new Set(), selectedFindings: new Set(), hovered: -1, measure: [], notes: [], dim: null,
      alignImage: [], alignPanel: [], box: null, pendingNote: null,
    });
    // R0603: 0.8 mm × 10 px/mm × 0.8 = 6.4 px < 8 px minimum; SOIC-8: 3.9 → 14 px (capped)
    expect(calls.filter((c) => c[0] === 'fillText').map((c) => c[1])).toEqual(['U1']);
  });
});
