// The workspace's stage marks: a ✓ only when that stage's own condition holds.
import { describe, expect, it } from 'vitest';
import type { Finding } from '../../shared/schemas/finding.schema';
import type { RevisionDetail } from '../../shared/schemas/program.schema';
import { stageMarks } from '../../src/app/routes/programs/stage-marks';

type R = Parameters<typeof stageMarks>[0];
const imported: NonNullable<RevisionDetail['imported']> = { rows: 20, dnp: 0, top: 20, bottom: 0, units: 'mm', columns: {}, headers: [], dialect: {}, warnings: [] };
const board = { originX: 0, originY: 0, width: 40, height: 30 };
const panel = { width: 100, height: 50, flipAxis: 'vertical', grid: { rows: 1, cols: 2, pitchX: 42, pitchY: 32, offsetX: 5, offsetY: 5, rotation: 0, cellRotations: [], skip: [] } };
const base = (over: Partial<R> = {}): R =>
  ({ imported: null, settings: { fiducials: [] }, findings: null, findingsSummary: null, waivers: [], state: 'draft', ...over }) as unknown as R;
const summary = { errors: 0, warnings: 0, placements: 40, seconds: 0.1 } as unknown as RevisionDetail['findingsSummary'];
const finding = (kind: string, key: string): Finding => ({ key, kind, severity: 'error', side: 'top', refs: ['1:U1'], boards: [1], message: kind, depth: null, geometry: { type: 'point', x: 0, y: 0 } }) as unknown as Finding;
const states = (r: R) => Object.fromEntries(Object.entries(stageMarks(r)).map(([k, v]) => [k, v.state]));

describe('stage marks', () => {
  it('a new revision: everything to do', () => {
    expect(states(base())).toEqual({ import: 'todo', panelize: 'todo', align: 'todo', assign: 'todo', verify: 'todo', release: 'todo' });
  });

  it('straight after an import with no panel, only Import is done (not Assign)', () => {
    const m = stageMarks(base({ imported }));
    expect(m.import.state).toBe('done');
    expect(m.panelize.state).toBe('todo');
    expect(m.assign.state).toBe('todo');
    expect(m.assign.why).toMatch(/board outline and the panel/);
    expect(m.verify.state).toBe('todo');
  });

  it('a board outline with zero size is not a panelized revision', () => {
    expect(stageMarks(base({ imported, settings: { board: { ...board, width: 0 }, panel, fiducials: [] } as never })).panelize.state).toBe('todo');
  });

  it('Assign waits for the checks to confirm packages and nozzles; then ✓, or ! while parts lack them', () => {
    const settings = { board, panel, fiducials: [] } as never;
    expect(stageMarks(base({ imported, settings })).assign.state).toBe('todo');
    expect(stageMarks(base({ imported, settings, findings: [], findingsSummary: summary })).assign.state).toBe('done');
    const f = finding('no-package', 'no-package|1:U1');
    const m = stageMarks(base({ imported, settings, findings: [f], findingsSummary: summary }));
    expect(m.assign.state).toBe('attention');
    expect(m.verify.state).toBe('attention');
    // waived: neither stage asks for more
    const w = stageMarks(base({ imported, settings, findings: [f], findingsSummary: summary, waivers: [{ id: 'w1', findingKey: f.key, scope: 'finding', kind: f.kind, reason: 'hand placed', userEmail: 'a@b.example', at: '2026-01-01T00:00:00Z', covers: 1 }] as never }));
    expect(w.assign.state).toBe('done');
    expect(w.verify.state).toBe('done');
  });

  it('an overlap is Verify’s business, not Assign’s', () => {
    const m = stageMarks(base({ imported, settings: { board, panel, fiducials: [] } as never, findings: [finding('body-overlap', 'body-overlap|1:R1|1:R2')], findingsSummary: summary }));
    expect(m.assign.state).toBe('done');
    expect(m.verify.state).toBe('attention');
  });

  it('Align is done with fiducials; Release is waiting in review and done once released', () => {
    expect(stageMarks(base({ settings: { fiducials: [{ name: 'F1', frame: 'panel', x: 1, y: 1 }] } as never })).align.state).toBe('done');
    expect(stageMarks(base({ state: 'in-review' })).release.state).toBe('waiting');
    expect(stageMarks(base({ state: 'released' })).release.state).toBe('done');
    expect(stageMarks(base({ state: 'superseded' })).release.state).toBe('done');
  });
});
