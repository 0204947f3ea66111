import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { runRevision } from '../../shared/engine';
import type { RunResult, Side } from '../../shared/core';
import { jobSchema } from '../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { buildScene, dimMask } from '../../src/features/canvas/scene';
import { CanvasStore, DEFAULT_LAYERS, LAYERS } from '../../src/features/canvas/store';

function faultyRuns() {
  const job = jobSchema.parse(JSON.parse(readFileSync('samples/faulty/job.json', 'utf8')));
  const library = libraryFileSchema.parse(JSON.parse(readFileSync('samples/library.json', 'utf8')));
  const csv = readFileSync('samples/faulty/faulty.csv', 'utf8');
  const runs = {} as Record<Side, RunResult>;
  const run = runRevision({ job, centroidText: csv, library, sides: 'both' });
  for (const r of run.runs) runs[r.side] = r;
  return { runs, findings: run.check!.findings };
}

describe('canvas store: layers', () => {
  it('has ten layers with our own names, each toggleable', () => {
    expect(LAYERS.map((l) => l.label)).toEqual(['Panel edge', 'Boards', 'Bodies', 'Courtyards', 'Pin-1 marks', 'References', 'Fiducials', 'Findings', 'Machine reach', 'Underlay image']);
    const s = new CanvasStore();
    expect(s.getState().layers).toEqual(DEFAULT_LAYERS);
    s.toggleLayer('courtyards');
    expect(s.getState().layers.courtyards).toBe(true);
    s.toggleLayer('bodies');
    expect(s.getState().layers.bodies).toBe(false);
    s.toggleLayer('bodies', true);
    expect(s.getState().layers.bodies).toBe(true);
  });

  it('notifies subscribers once per change', () => {
    const s = new CanvasStore();
    let n = 0;
    const off = s.subscribe(() => n++);
    s.toggleLayer('labels');
    s.setTool('measure');
    off();
    s.toggleLayer('labels');
    expect(n).toBe(2);
  });
});

describe('canvas store: linked selection on the faulty sample', () => {
  const { runs, findings } = faultyRuns();
  const scene = buildScene(runs.top, findings);
  const idx = (r: string) => scene.byRef.get(r)!;

  it('selecting a part selects the findings that name it', () => {
    const s = new CanvasStore();
    s.links = scene.links;
    s.selectParts([idx('1:R1')]);
    const keys = [...s.getState().selectedFindings];
    expect(keys).toHaveLength(1);
    expect(findings.find((f) => f.key === keys[0])!.kind).toBe('body-overlap');
  });

  it('selecting a finding selects its parts; toggling and adding work on both', () => {
    const s = new CanvasStore();
    s.links = scene.links;
    const overlap = scene.findings.find((f) => f.kind === 'body-overlap' && f.refs[0] === '1:R1')!;
    s.selectFindings([overlap.key]);
    expect([...s.getState().selected].sort((a, b) => a - b)).toEqual([idx('1:R1'), idx('1:R2')].sort((a, b) => a - b));
    s.selectParts([idx('2:U1')], 'add');
    expect(s.getState().selected.size).toBe(3);
    expect([...s.getState().selectedFindings].map((k) => findings.find((f) => f.key === k)!.kind).sort()).toEqual(['body-overlap', 'out-of-reach']);
    s.selectParts([idx('2:U1')], 'toggle');
    expect(s.getState().selected.has(idx('2:U1'))).toBe(false);
    s.clearSelection();
    expect(s.getState().selected.size).toBe(0);
    expect(s.getState().selectedFindings.size).toBe(0);
  });

  it('keeps at most two measure points and starts again on the third', () => {
    const s = new CanvasStore();
    s.setTool('measure');
    s.addMeasurePoint({ x: 0, y: 0, part: -1 });
    s.addMeasurePoint({ x: 3, y: 4, part: -1 });
    expect(s.getState().measure).toHaveLength(2);
    s.addMeasurePoint({ x: 1, y: 1, part: -1 });
    expect(s.getState().measure).toEqual([{ x: 1, y: 1, part: -1 }]);
    s.setTool('select');
    expect(s.getState().measure).toEqual([]);
  });

  it('filters dim the rest: by package, by nozzle, by finding kind', () => {
    const p = runs.top.placements;
    const byPkg = dimMask(scene, { packages: ['R0603'], nozzles: [], kinds: [] })!;
    for (let i = 0; i < p.count; i++) expect(byPkg[i]).toBe(p.packageName[i] === 'R0603' ? 0 : 1);
    const byKind = dimMask(scene, { packages: [], nozzles: [], kinds: ['nozzle-shadow'] })!;
    const lit = [...Array(p.count).keys()].filter((i) => !byKind[i]).map((i) => `${p.board[i]}:${p.ref[i]}`).sort();
    expect(lit).toEqual(['1:C3', '1:C4', '2:C3', '2:C4']);
    const none = dimMask(scene, { packages: [], nozzles: ['(none)'], kinds: [] })!;
    expect([...Array(p.count).keys()].filter((i) => !none[i]).map((i) => p.ref[i]).sort()).toEqual(['J9', 'J9', 'R9', 'R9']);
    expect(dimMask(scene, { packages: [], nozzles: [], kinds: [] })).toBeNull();
  });

  it('the scene maps the output frame back to the panel frame', () => {
    // faulty: nothing measured, so the output frame is the panel frame
    expect(scene.toPanel).toEqual({ a: 1, b: 0, c: 0, d: 1, tx: 0, ty: 0 });
    expect(scene.toMachine).toBeNull();
    // bounds: panel 80 × 40 and board 2 out to x 84
    expect(scene.bounds.minX).toBe(0);
    expect(scene.bounds.maxX).toBe(84);
  });
});

describe('review summary rule', () => {
  it('approval needs every error waived or gone; warnings do not count', async () => {
    const { unresolvedErrors } = await import('../../src/features/canvas');
    const { findings } = faultyRuns();
    const errors = findings.filter((f) => f.severity === 'error');
    expect(unresolvedErrors(findings)).toHaveLength(errors.length);
    expect(unresolvedErrors(findings, new Set(errors.map((f) => f.key)))).toEqual([]);
    expect(unresolvedErrors(findings.filter((f) => f.severity === 'warning'))).toEqual([]);
  });
});
