import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { jobSchema, type Job, type JobInput } from '../../../shared/schemas/job.schema';
import { libraryFileSchema, type LibraryFile } from '../../../shared/schemas/library-file.schema';
import { runJob } from '../../../shared/pipeline';
import type { RunResult, Side } from '../../../shared/core';

export const root = join(dirname(fileURLToPath(import.meta.url)), '../../..');
export const samplePath = (rel: string) => join(root, 'samples', rel);

export function loadSampleLibrary(): LibraryFile {
  return libraryFileSchema.parse(JSON.parse(readFileSync(samplePath('library.json'), 'utf8')));
}

export function runSample(name: 'weather-station' | 'led-strip', side: Side): RunResult {
  const job = jobSchema.parse(JSON.parse(readFileSync(samplePath(`${name}/job.json`), 'utf8')));
  const text = readFileSync(samplePath(`${name}/${job.centroid}`), 'utf8');
  return runJob({ job, centroidText: text, library: loadSampleLibrary(), side });
}

export function job(input: Partial<JobInput> & Pick<JobInput, 'board' | 'panel'>): Job {
  return jobSchema.parse({ centroid: 'x.csv', import: { units: 'mm' }, ...input });
}

/** Corners of a body rectangle L × W centred on (x, y), turned by rot degrees. */
export function bodyCorners(x: number, y: number, L: number, W: number, rot: number): [number, number][] {
  const r = (rot * Math.PI) / 180, c = Math.cos(r), s = Math.sin(r);
  return [[-L / 2, -W / 2], [L / 2, -W / 2], [L / 2, W / 2], [-L / 2, W / 2]].map(([u, v]) => [x + c * u - s * v, y + s * u + c * v]);
}

/** Separating-axis test: true when two convex polygons overlap by more than eps. */
export function polygonsOverlap(a: [number, number][], b: [number, number][], eps = 1e-6): boolean {
  for (const poly of [a, b]) {
    for (let i = 0; i < poly.length; i++) {
      const [x1, y1] = poly[i], [x2, y2] = poly[(i + 1) % poly.length];
      const nx = y2 - y1, ny = x1 - x2, len = Math.hypot(nx, ny);
      const pa = a.map(([x, y]) => (x * nx + y * ny) / len), pb = b.map(([x, y]) => (x * nx + y * ny) / len);
      if (Math.max(...pa) - eps <= Math.min(...pb) || Math.max(...pb) - eps <= Math.min(...pa)) return false;
    }
  }
  return true;
}

export function pointInConvex(p: [number, number], poly: [number, number][], eps = 1e-6): boolean {
  let sign = 0;
  for (let i = 0; i < poly.length; i++) {
    const [x1, y1] = poly[i], [x2, y2] = poly[(i + 1) % poly.length];
    const cr = (x2 - x1) * (p[1] - y1) - (y2 - y1) * (p[0] - x1);
    if (Math.abs(cr) < eps) continue;
    const s = Math.sign(cr);
    if (sign === 0) sign = s;
    else if (s !== sign) return false;
  }
  return true;
}
