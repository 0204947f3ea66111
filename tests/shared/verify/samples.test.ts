// The demo samples through the whole chain (job file → pipeline → adapter → findings) and the
// `check` command line: the two clean demo jobs have no error finding; samples/faulty has exactly
// the faults planted in it (samples/faulty/README.md lists each one with its arithmetic).
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { loadJob } from '../../../server/cli/common';
import { main } from '../../../server/cli';
import { runJob } from '../../../shared/pipeline';
import { verifyInputFromRuns } from '../../../shared/verify';
import { verify } from '../../../shared/verify';
import { checkResultSchema, type Finding } from '../../../shared/schemas/finding.schema';

async function checkJob(path: string, sides: ('top' | 'bottom')[] = ['top', 'bottom']) {
  const loaded = await loadJob(path);
  const runs = sides.map((side) =>
    runJob({ job: loaded.job, centroidText: loaded.centroidText, library: loaded.library, side, jobFile: path }),
  );
  const input = verifyInputFromRuns(runs);
  return { input, result: verify(input, { sides: sides.length === 2 ? 'both' : sides[0] }) };
}

async function cli(...argv: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, { stdout: (s) => (stdout += s), stderr: (s) => (stderr += s) });
  return { code, stdout, stderr };
}

describe('clean demo samples', () => {
  test.each(['samples/weather-station/job.json', 'samples/led-strip/job.json'])('%s has no error finding', async (path) => {
    const { input, result } = await checkJob(path);
    expect(input.count).toBeGreaterThan(100);
    // the checks really ran: both sides, outlines, fiducials and a machine are present
    expect(input.boards.length).toBeGreaterThan(1);
    expect(input.fiducials.length).toBeGreaterThan(0);
    expect(input.reach).not.toBeNull();
    expect(result.findings.filter((f) => f.severity === 'error').map((f) => f.message)).toEqual([]);
    expect(result.summary.errors).toBe(0);
    expect(result.summary.placements).toBe(input.count);
  });

  test('the same job with a smaller machine does find out-of-reach placements (the check is live)', async () => {
    const { input } = await checkJob('samples/led-strip/job.json');
    input.reach = { x: 200, y: 400 };
    const res = verify(input);
    expect(res.summary.byKind['out-of-reach']).toBeGreaterThan(1);
  });
});

/** The planted faults of samples/faulty (README.md), as [kind, severity, refs or boards]. */
const PLANTED: [Finding['kind'], Finding['severity'], string][] = [
  ['body-overlap', 'error', '1:R1,1:R2'],
  ['body-overlap', 'error', '2:R1,2:R2'],
  ['off-board', 'error', '1:R3'],
  ['off-board', 'error', '2:R3'],
  ['board-overlap', 'error', 'boards 1,2'],
  ['off-panel', 'error', 'boards 2'],
  ['fiducial-clearance', 'error', '1:R4'],
  ['fiducial-clearance', 'error', '2:R4'],
  ['out-of-reach', 'error', 'boards '],
  ['out-of-reach', 'error', '2:U1'],
  ['no-package', 'error', '1:J9'],
  ['no-package', 'error', '2:J9'],
  ['no-nozzle', 'error', '1:R9'],
  ['no-nozzle', 'error', '2:R9'],
  ['courtyard-overlap', 'warning', '1:C1,1:C2'],
  ['courtyard-overlap', 'warning', '2:C1,2:C2'],
  ['nozzle-shadow', 'warning', '1:C3,1:C4'],
  ['nozzle-shadow', 'warning', '2:C3,2:C4'],
  ['nozzle-size', 'warning', '1:R4'],
  ['nozzle-size', 'warning', '2:R4'],
];

const brief = (f: Finding): [string, string, string] => [f.kind, f.severity, f.refs.length ? f.refs.join(',') : `boards ${f.boards.join(',')}`];

describe('samples/faulty', () => {
  test('finds exactly the planted faults, in report order', async () => {
    const { result } = await checkJob('samples/faulty/job.json');
    expect(result.findings.map(brief)).toEqual(PLANTED);
    expect(result.summary).toMatchObject({ errors: 14, warnings: 6 });
  });

  test('the planted measures come out as worked in the README', async () => {
    const { result } = await checkJob('samples/faulty/job.json');
    const by = (key: string) => result.findings.find((f) => f.key === key)!;
    // R1/R2: 1.6 − 1.2 = 0.4 mm
    expect(by('body-overlap|1:R1|1:R2').depth!).toBeCloseTo(0.4, 9);
    expect(by('body-overlap|1:R1|1:R2').message).toBe('R1 on board 1 overlaps R2 on board 1 by 0.400 mm');
    // C1/C2: bodies 0.2 apart, courtyards 0.5 → 0.3
    expect(by('courtyard-overlap|1:C1|1:C2')).toMatchObject({ severity: 'warning' });
    expect(by('courtyard-overlap|1:C1|1:C2').depth!).toBeCloseTo(0.3, 9);
    expect(by('courtyard-overlap|1:C1|1:C2').distance!).toBeCloseTo(0.2, 9);
    // R3: 0.3 mm off the board edge
    expect(by('off-board|2:R3').depth!).toBeCloseTo(0.3, 9);
    // boards: 1 mm overlap, 4 mm past the panel
    expect(by('board-overlap|boards:1,2').depth!).toBeCloseTo(1, 9);
    expect(by('off-panel|boards:2').depth!).toBeCloseTo(4, 9);
    // R4: 0.7 from BF1 → 0.3 inside
    expect(by('fiducial-clearance|1:R4')).toMatchObject({ fiducial: 'BF1@1' });
    expect(by('fiducial-clearance|1:R4').distance!).toBeCloseTo(0.7, 9);
    // C3: 1.7 from C4's body, holder radius 2.0 (N05)
    expect(by('nozzle-shadow|1:C3|1:C4').distance!).toBeCloseTo(1.7, 9);
    expect(by('nozzle-shadow|1:C3|1:C4').message).toContain('place C3 first');
    // U1 on board 2 at x = 79 on a 75 mm reach; the 80 mm panel is larger than the reach
    expect(by('out-of-reach|2:U1').depth!).toBeCloseTo(4, 9);
    expect(by('out-of-reach|panel')).toMatchObject({ refs: [], boards: [], board: null });
  });

  test('do-not-place R20 (on top of R1) is never checked; R10 on the bottom does not meet R1 on top', async () => {
    const { input, result } = await checkJob('samples/faulty/job.json');
    expect(input.ref).not.toContain('R20');
    // 11 top parts and 2 bottom parts placed, on 2 boards
    expect(input.count).toBe(26);
    expect(result.summary.placements).toBe(26);
    for (const f of result.findings) {
      expect(f.refs.some((r) => /:R20$|:R10$|:C10$/.test(r))).toBe(false);
    }
  });

  test('bottom only: no part finding on the bottom; the panel layout is checked there instead', async () => {
    const { result } = await checkJob('samples/faulty/job.json', ['bottom']);
    expect(result.findings.every((f) => f.refs.length === 0)).toBe(true);
    expect(result.findings.map((f) => f.kind).sort()).toEqual(['board-overlap', 'off-panel', 'out-of-reach']);
  });
});

describe('cli check', () => {
  test('faulty job: exit 1, JSON on stdout with the findings and the summary', async () => {
    const { code, stdout, stderr } = await cli('check', 'samples/faulty/job.json');
    expect(code).toBe(1);
    expect(stderr).toBe('');
    const out = checkResultSchema.parse(JSON.parse(stdout));
    expect(out.findings.map(brief)).toEqual(PLANTED);
    expect(Object.keys(out.summary).sort()).toEqual(['errors', 'placements', 'seconds', 'warnings']);
    expect(out.summary).toMatchObject({ errors: 14, warnings: 6, placements: 26 });
  });

  test('clean job: exit 0; --side top counts the top placements only; --out writes the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-check-'));
    try {
      const file = join(dir, 'findings.json');
      const both = await cli('check', 'samples/weather-station/job.json');
      expect(both.code).toBe(0);
      const top = await cli('check', 'samples/weather-station/job.json', '--side', 'top', '--out', file);
      expect(top.code).toBe(0);
      expect(top.stdout).toBe('');
      const all = JSON.parse(both.stdout);
      const t = JSON.parse(readFileSync(file, 'utf8'));
      expect(t.summary.placements).toBeGreaterThan(0);
      expect(t.summary.placements).toBeLessThan(all.summary.placements);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  test.each([
    [['check', 'samples/nope/job.json'], /nope\/job\.json/],
    [['check', 'samples/faulty/job.json', '--side', 'left'], /--side left: expected top\|bottom\|both/],
    [['check'], /expected one job file/],
  ])('bad input %j: exit 2, one line on stderr, nothing on stdout', async (argv, pattern) => {
    const { code, stdout, stderr } = await cli(...argv);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(pattern);
  });
});
