import type { RunFileDto } from '../../../../shared/schemas/program.schema';

export interface RunFileEntry {
  runFile: RunFileDto;
  /** label of the newer release of the same program that replaced this one */
  supersededBy: string | null;
  /** true for the revision an operator should load: the program's newest release */
  current: boolean;
}

export interface ProgramRunFiles {
  programId: string;
  programName: string;
  product: string;
  board: string;
  entries: RunFileEntry[];
}

const time = (r: RunFileDto) => (r.releasedAt ? Date.parse(r.releasedAt) : 0);

/**
 * Run files by program: programs with the latest release first; within a program the current
 * release first, then the superseded ones newest first, each naming the release that replaced it.
 */
export function orderRunFiles(items: readonly RunFileDto[]): ProgramRunFiles[] {
  const byProgram = new Map<string, RunFileDto[]>();
  for (const r of items) {
    const list = byProgram.get(r.programId);
    if (list) list.push(r);
    else byProgram.set(r.programId, [r]);
  }
  const programs = [...byProgram.values()].map((revs) => {
    const sorted = [...revs].sort((a, b) => Number(b.state === 'released') - Number(a.state === 'released') || time(b) - time(a));
    const byTime = [...revs].sort((a, b) => time(a) - time(b));
    const entries = sorted.map((r) => {
      let supersededBy: string | null = null;
      if (r.state === 'superseded') {
        const next = byTime.find((x) => x !== r && time(x) > time(r));
        supersededBy = next?.label ?? sorted.find((x) => x.state === 'released')?.label ?? null;
      }
      return { runFile: r, supersededBy, current: r.state === 'released' };
    });
    const first = sorted[0];
    return { programId: first.programId, programName: first.programName, product: first.product, board: first.board, entries, latest: Math.max(...revs.map(time)) };
  });
  return programs.sort((a, b) => b.latest - a.latest || a.programName.localeCompare(b.programName)).map(({ latest: _l, ...p }) => p);
}
