import type { PlacementColumns } from '../../../shared/core';
export { buildBodyIndex, hitBox, hitPoint, hitPointBrute } from '../../../shared/canvas/hit';

export function hitBoxBruteForTest(p: PlacementColumns, box: { minX: number; minY: number; maxX: number; maxY: number }): number[] {
  const out: number[] = [];
  for (let i = 0; i < p.count; i++) if (p.x[i] >= box.minX && p.x[i] <= box.maxX && p.y[i] >= box.minY && p.y[i] <= box.maxY) out.push(i);
  return out;
}
