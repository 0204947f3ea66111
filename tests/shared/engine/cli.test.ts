import { describe, expect, test } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../../server/cli';
import { readPlacementList } from '../../../shared/placement-list';
import { samplePath } from './helpers';

async function cli(...argv: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, { stdout: (s) => (stdout += s), stderr: (s) => (stderr += s) });
  return { code, stdout, stderr };
}

const tmp = mkdtempSync(join(tmpdir(), 'pw-cli-'));
const write = (name: string, text: string) => {
  const p = join(tmp, name);
  writeFileSync(p, text);
  return p;
};

describe('cli import', () => {
  test('the LED strip sample: mil and decimal comma from the file itself', async () => {
    const r = await cli('import', samplePath('led-strip/led-strip.csv'));
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.units).toBe('mil');
    expect(out.placements).toHaveLength(14);
    expect(Object.keys(out.placements[0])).toEqual(['ref', 'x', 'y', 'rotation', 'side', 'footprint', 'value', 'partNumber', 'dnp']);
    // D1 at 550 mil = 13.97 mm (NIST SP 811: 1 mil = 0.0254 mm)
    expect(out.placements[0].x).toBeCloseTo(13.97, 9);
    expect(out.columns.x).toBe('Mid X(mil)');
    expect(out.warnings[0]).toMatchObject({ line: 2 });
  });
  test('weather-station sample needs --units', async () => {
    const bad = await cli('import', samplePath('weather-station/weather-ctl.csv'));
    expect(bad.code).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/^error: .*weather-ctl\.csv:1, column "PosX": the units cannot be told/);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const ok = await cli('import', samplePath('weather-station/weather-ctl.csv'), '--units', 'mm');
    expect(ok.code).toBe(0);
    expect(JSON.parse(ok.stdout).placements).toHaveLength(180);
  });
  test('a bad number: exit 2, one line naming file, line and column, nothing on stdout', async () => {
    const f = write('bad.csv', 'Ref,X,Y,Rot\nR1,1,2,0\nR2,1,zz,0\n');
    const r = await cli('import', f, '--units=mm');
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(`error: ${f}:3, column "Y": expected a number, got "zz"\n`);
  });
  test('--map and --bottom-rotation', async () => {
    const f = write('map.csv', 'Part,Xpos,Ypos,Turn,Side\nR1,1,2,30,bottom\n');
    const r = await cli('import', f, '--units', 'mm', '--map', 'ref=Part', '--map', 'rotation=Turn', '--bottom-rotation', 'mirror-180');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).placements[0].rotation).toBe(150);
  });
  test.each([
    [['import'], /expected one centroid file/],
    [['import', 'a.csv', '--units', 'cm'], /--units cm: expected mm\|mil\|in/],
    [['import', 'a.csv', '--map', 'colour=Red'], /--map colour=Red/],
    [['import', 'a.csv', '--frobnicate'], /unknown option --frobnicate/],
    [['import', join(tmp, 'missing.csv'), '--units', 'mm'], /missing\.csv: cannot read: no such file/],
    [['launch'], /unknown command "launch"/],
    [[], /Usage/],
  ])('usage errors exit 2: %j', async (argv, re) => {
    const r = await cli(...argv);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(re);
  });
  test('--help', async () => {
    for (const c of ['import', 'panelize', 'align']) {
      const r = await cli(c, '--help');
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(new RegExp(`^Usage: cli ${c}`));
    }
    expect((await cli('--help')).stdout).toMatch(/import .*\n.*panelize .*\n.*align/);
  });
});

describe('cli panelize', () => {
  test('weather-station top, CSV to stdout, readable back', async () => {
    const r = await cli('panelize', samplePath('weather-station/job.json'), '--generated', '2026-03-11T09:00:00Z');
    expect(r.code).toBe(0);
    expect(r.stdout.startsWith('# format: placewright-placement-list/1\n')).toBe(true);
    const list = await readPlacementList(r.stdout);
    expect(list.meta.frame).toBe('machine');
    expect(list.placements.length).toBe(list.meta.placements);
  });
  test('JSON to --out', async () => {
    const out = join(tmp, 'led.json');
    const r = await cli('panelize', samplePath('led-strip/job.json'), '--side', 'bottom', '--format', 'json', '--out', out);
    expect(r.code).toBe(0);
    expect(r.stdout).toBe('');
    const list = JSON.parse(readFileSync(out, 'utf8'));
    expect(list.meta.side).toBe('bottom');
    expect(list.placements).toHaveLength(40); // U1 and J1 on 20 boards
  });
  test('job errors name the file and field', async () => {
    const f = write('job.json', JSON.stringify({ centroid: 'x.csv', board: { width: 10, height: 10 }, panel: { width: 10, height: 10, grid: { rows: 0, cols: 1, pitchX: 1, pitchY: 1 } } }));
    const r = await cli('panelize', f);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/job\.json, panel\.grid\.rows: /);
  });
  test('a misspelt job key is refused', async () => {
    const f = write('job2.json', JSON.stringify({ centroid: 'x.csv', bord: {}, board: { width: 10, height: 10 }, panel: { width: 10, height: 10, instances: [{ x: 0, y: 0 }] } }));
    const r = await cli('panelize', f);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/bord/);
  });
  test('invalid JSON names line and column', async () => {
    const f = write('job3.json', '{\n  "centroid": "x.csv",\n  oops\n}');
    const r = await cli('panelize', f);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/job3\.json:3, column "\d+": not valid JSON/);
  });
  test('the centroid file\'s errors name the centroid file', async () => {
    write('broken.csv', 'Ref,X,Y,Rot\nR1,1,2,0\nR1,1,2,0\n');
    const f = write('job4.json', JSON.stringify({ centroid: 'broken.csv', import: { units: 'mm' }, board: { width: 10, height: 10 }, panel: { width: 10, height: 10, instances: [{ x: 0, y: 0 }] } }));
    const r = await cli('panelize', f);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe('error: broken.csv:3, column "Ref": duplicate reference "R1" (first on line 2)\n');
  });
});

describe('cli align', () => {
  test('weather-station: transform JSON per server/cli/README.md', async () => {
    const r = await cli('align', samplePath('weather-station/job.json'));
    expect(r.code).toBe(0);
    const t = JSON.parse(r.stdout);
    expect(Object.keys(t)).toEqual(expect.arrayContaining(['model', 'rotationDeg', 'scale', 'tx', 'ty', 'matrix', 'residuals', 'rmsResidual', 'warnings']));
    expect(t.model).toBe('affine');
    expect(t.residuals.map((x: { name: string }) => x.name)).toEqual(['PT1', 'PT2', 'PT3', 'PT4']);
    expect(t.rotationDeg).toBeGreaterThan(0.1);
    expect(t.rotationDeg).toBeLessThan(0.15);
    expect(t.boards.map((b: { board: number }) => b.board)).toEqual([2]);
  });
  test('no measured fiducial: model none', async () => {
    const r = await cli('align', samplePath('led-strip/job.json'));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).model).toBe('none');
  });
  test('collinear fiducials under affine: exit 2', async () => {
    write('c.csv', 'Ref,X,Y,Rot\nR1,1,2,0\n');
    const fids = [0, 1, 2].map((i) => ({ name: `F${i}`, side: 'top', frame: 'panel', x: 10 * i, y: 10 * i, measured: { x: 10 * i, y: 10 * i } }));
    const f = write('col.json', JSON.stringify({ centroid: 'c.csv', import: { units: 'mm' }, transform: 'affine', fiducials: fids, board: { width: 10, height: 10 }, panel: { width: 30, height: 30, instances: [{ x: 0, y: 0 }] } }));
    const r = await cli('align', f);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/lie on one line/);
  });
});
