// The marks beside the workspace's stages. A mark says whether that stage's own condition holds,
// never merely that an earlier stage was done: "Assign ✓" straight after an import, with no
// panel and nothing assigned, was a lie.
import type { RevisionDetail } from '../../../../shared/schemas/program.schema';
import { waivedKeys } from '../../../../shared/review';

export const STAGES = [
  { path: 'import', label: 'Import' },
  { path: 'panelize', label: 'Panelize' },
  { path: 'align', label: 'Align' },
  { path: 'assign', label: 'Assign' },
  { path: 'verify', label: 'Verify' },
  { path: 'release', label: 'Release' },
] as const;
export type StagePath = (typeof STAGES)[number]['path'];

/** done ✓ · todo ○ · attention ! (something to fix) · waiting … (with someone else) */
export type StageState = 'done' | 'todo' | 'attention' | 'waiting';
export interface StageMark {
  state: StageState;
  /** why, in a few words (the mark's tooltip and accessible name) */
  why: string;
}

/** The findings the Assign stage answers for: parts the library or the machine cannot serve. */
const ASSIGN_KINDS = new Set(['no-package', 'no-nozzle']);

export function stageMarks(r: Pick<RevisionDetail, 'imported' | 'settings' | 'findings' | 'findingsSummary' | 'waivers' | 'state'>): Record<StagePath, StageMark> {
  const imported = !!r.imported;
  const boardSet = !!r.settings.board && r.settings.board.width > 0 && r.settings.board.height > 0;
  const panelSet = !!r.settings.panel;
  const runnable = imported && boardSet && panelSet;
  const checked = r.findingsSummary !== null && r.findings !== null;
  const waived = waivedKeys(r.findings ?? [], r.waivers);
  const open = (r.findings ?? []).filter((f) => f.severity === 'error' && !waived.has(f.key));
  const openAssign = open.filter((f) => ASSIGN_KINDS.has(f.kind)).length;
  const fiducials = r.settings.fiducials?.length ?? 0;

  const assign: StageMark = !runnable
    ? { state: 'todo', why: 'needs an imported file, the board outline and the panel' }
    : !checked
      ? { state: 'todo', why: 'run the checks to confirm every part has a package and a nozzle' }
      : openAssign > 0
        ? { state: 'attention', why: `${openAssign} part${openAssign === 1 ? '' : 's'} without a package or a nozzle` }
        : { state: 'done', why: 'every part has a package and a nozzle' };

  return {
    import: imported ? { state: 'done', why: 'a centroid file is imported' } : { state: 'todo', why: 'no centroid file yet' },
    panelize: boardSet && panelSet ? { state: 'done', why: 'board outline and panel set' } : { state: 'todo', why: boardSet ? 'no panel yet' : 'no board outline yet' },
    align: fiducials > 0 ? { state: 'done', why: `${fiducials} fiducial${fiducials === 1 ? '' : 's'} set` } : { state: 'todo', why: 'no fiducials yet' },
    assign,
    verify: !checked
      ? { state: 'todo', why: runnable ? 'not checked since the last change' : 'nothing to check yet' }
      : open.length > 0
        ? { state: 'attention', why: `${open.length} error${open.length === 1 ? '' : 's'} to fix or waive` }
        : { state: 'done', why: 'checked; no open errors' },
    release:
      r.state === 'released' || r.state === 'superseded'
        ? { state: 'done', why: 'released' }
        : r.state === 'in-review'
          ? { state: 'waiting', why: 'submitted: waiting for a reviewer' }
          : { state: 'todo', why: 'not submitted yet' },
  };
}
