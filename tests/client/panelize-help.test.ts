// Panelize help: the default pitch, overlapping boards as typed, the outline
// fitted to the parts.
import { describe, expect, it } from 'vitest';
import { BOARD_GAP_MM, defaultPitch, outlineFromExtent, panelProblems } from '../../src/app/routes/programs/stages/panelize-help';

const board = { originX: 0, originY: 0, width: 40, height: 30 };
const grid = (over: Record<string, unknown> = {}) => ({ rows: 1, cols: 2, pitchX: 42, pitchY: 32, offsetX: 5, offsetY: 5, rotation: 0, cellRotations: [], skip: [], ...over });
const panel = (g: Record<string, unknown>, w = 100, h = 50) => ({ width: w, height: h, flipAxis: 'vertical', grid: grid(g) });

describe('panelize help', () => {
  it('the default pitch is the board size plus the gap; unknown size gives 0', () => {
    expect(BOARD_GAP_MM).toBe(2);
    expect(defaultPitch(board)).toEqual({ pitchX: 42, pitchY: 32 });
    expect(defaultPitch({ width: NaN, height: 30 })).toEqual({ pitchX: 0, pitchY: 32 });
    expect(defaultPitch(undefined)).toEqual({ pitchX: 0, pitchY: 0 });
  });

  it('boards at the default pitch neither overlap nor leave a panel that holds them', () => {
    expect(panelProblems(board, panel({}))).toEqual({ overlaps: [], offPanel: [] });
  });

  it('a pitch of 0 stacks the boards: reported as an overlap', () => {
    expect(panelProblems(board, panel({ pitchX: 0, pitchY: 0 }))!.overlaps).toEqual([[1, 2]]);
  });

  it('boards that only touch (pitch = board size, V-scored) do not overlap', () => {
    expect(panelProblems(board, panel({ pitchX: 40 }))!.overlaps).toEqual([]);
  });

  it('a board turned 90° takes its turned size: 30 mm wide, so a 35 mm pitch clears it but 25 mm does not', () => {
    const turned = { cellRotations: [{ row: 0, col: 1, rotation: 90 }] };
    expect(panelProblems(board, panel({ pitchX: 41, ...turned }))!.overlaps).toEqual([]);
    // board 2 turned: its anchor is its turned bounding box's lower-left; board 1 spans x 5…45
    expect(panelProblems(board, panel({ pitchX: 35, ...turned }))!.overlaps).toEqual([[1, 2]]);
  });

  it('a board past the panel edge is named', () => {
    expect(panelProblems(board, panel({}, 80, 50))!.offPanel).toEqual([2]); // board 2 spans x 47…87
  });

  it('nothing to say while the board or the panel is incomplete', () => {
    expect(panelProblems({ width: NaN, height: 30 }, panel({}))).toBeNull();
    expect(panelProblems(board, { width: 100 })).toBeNull();
  });

  it('fits the outline to the parts with the margin on every side', () => {
    expect(outlineFromExtent({ minX: 3.5, minY: 2, maxX: 38.25, maxY: 27 }, 2)).toEqual({ originX: 1.5, originY: 0, width: 38.75, height: 29 });
  });
});
