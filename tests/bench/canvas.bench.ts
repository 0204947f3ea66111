// `npm run bench:canvas`: the canvas overlay at 50,000 parts in headless Chromium.
//
// Builds tests/bench/canvas/ (its own entry: a seeded 50,000-part panel mounted on the real
// PanelCanvas) with Vite, serves it on a loopback port and drives Debian's Chromium with
// playwright-core. Measures, for the full panel and for the panel outline alone (the floor, same
// run): the first full draw (mount + scene build + first paint of every layer) and the median
// frame time of a scripted pan (120 frames) and zoom (120 wheel steps); the same for the whole
// PanelReview (canvas, tables and controls) as an extra figure. Targets: first draw
// ≤ 1,500 ms, median frame ≤ 33 ms. The last line printed is one JSON object of the figures.
import { createReadStream, existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const here = fileURLToPath(new URL('.', import.meta.url));
const root = resolve(here, 'canvas');
const TARGET_FIRST_DRAW_MS = 1500;
const TARGET_FRAME_MS = 33;

const MIME: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.json': 'application/json', '.svg': 'image/svg+xml', '.woff2': 'font/woff2' };

async function buildHarness(outDir: string) {
  const { build } = await import('vite');
  const react = (await import('@vitejs/plugin-react')).default;
  await build({
    root,
    configFile: false,
    logLevel: 'error',
    plugins: [react()],
    build: { outDir, emptyOutDir: true, chunkSizeWarningLimit: 5000 },
  });
}

function serve(dir: string): Promise<Server> {
  const server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://x');
    let file = join(dir, decodeURIComponent(url.pathname));
    if (!file.startsWith(dir) || !existsSync(file) || statSync(file).isDirectory()) file = join(dir, 'index.html');
    res.writeHead(200, { 'Content-Type': MIME[extname(file)] ?? 'application/octet-stream' });
    createReadStream(file).pipe(res);
  });
  return new Promise((r) => server.listen(0, '127.0.0.1', () => r(server)));
}

const median = (a: number[]) => {
  const s = [...a].sort((x, y) => x - y);
  return s.length ? (s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2) : NaN;
};
const r1 = (v: number) => Math.round(v * 10) / 10;

interface PageFigures {
  parts: number;
  findings: number;
  firstDrawMs: number;
  frameMedianMs: number;
  frameP95Ms: number;
  drawMedianMs: number;
}

export async function run(): Promise<Record<string, unknown>> {
  const t0 = performance.now();
  const out = mkdtempSync(join(tmpdir(), 'pw-canvas-bench-'));
  const profile = mkdtempSync(join(tmpdir(), 'pw-canvas-chromium-'));
  let server: Server | null = null;
  const browser = await (async () => {
    await buildHarness(out);
    server = await serve(out);
    return chromium.launchPersistentContext(profile, {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      headless: true,
      viewport: { width: 1300, height: 800 },
      args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
  })();
  const base = `http://127.0.0.1:${(server!.address() as AddressInfo).port}`;
  const measure = async (mode: 'full' | 'floor', ui = 'canvas'): Promise<PageFigures> => {
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    try {
      await page.goto(`${base}/?mode=${mode}&ui=${ui}`);
      await page
        .waitForFunction(() => !!window.__bench?.frames || !!window.__bench?.error, null, { timeout: 60_000 })
        .catch(async (e) => {
          console.error('partial', JSON.stringify(await page.evaluate(() => ({ ...window.__bench, frames: window.__bench?.frames?.length }))));
          throw new Error(`bench page (${mode}) did not finish: ${errors.join('; ') || (e as Error).message}`);
        });
      const b = (await page.evaluate(() => window.__bench))!;
      if (b.error) throw new Error(`bench page (${mode}): ${b.error}`);
      const frames = b.frames!;
      const sorted = [...frames].sort((x, y) => x - y);
      return {
        parts: b.parts,
        findings: b.findings,
        firstDrawMs: r1(b.firstDrawMs!),
        frameMedianMs: r1(median(frames)),
        frameP95Ms: r1(sorted[Math.floor(sorted.length * 0.95)]),
        drawMedianMs: r1(median(b.drawMs!)),
      };
    } finally {
      await page.close();
    }
  };
  try {
    const floor = await measure('floor');
    const full = await measure('full');
    // the same panel in the whole review (canvas + placement and findings tables + controls)
    const review = await measure('full', 'review');
    const figures = {
      canvasParts: full.parts,
      canvasFindings: full.findings,
      canvasFirstDrawMs: full.firstDrawMs,
      canvasFirstDrawFloorMs: floor.firstDrawMs,
      canvasFrameMedianMs: full.frameMedianMs,
      canvasFrameMedianFloorMs: floor.frameMedianMs,
      canvasFrameP95Ms: full.frameP95Ms,
      canvasDrawMedianMs: full.drawMedianMs,
      canvasDrawMedianFloorMs: floor.drawMedianMs,
      canvasReviewFirstDrawMs: review.firstDrawMs,
      canvasReviewFrameMedianMs: review.frameMedianMs,
      canvasFirstDrawTargetMs: TARGET_FIRST_DRAW_MS,
      canvasFrameTargetMs: TARGET_FRAME_MS,
      canvasFirstDrawMet: full.firstDrawMs <= TARGET_FIRST_DRAW_MS,
      canvasFrameMet: full.frameMedianMs <= TARGET_FRAME_MS,
      canvasBenchSeconds: r1((performance.now() - t0) / 1000),
    };
    return figures;
  } finally {
    await browser.close();
    await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
    rmSync(out, { recursive: true, force: true });
    rmSync(profile, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const figures = await run();
  console.error(
    `canvas, ${figures.canvasParts} parts: first draw ${figures.canvasFirstDrawMs} ms (floor ${figures.canvasFirstDrawFloorMs} ms, target ≤ ${TARGET_FIRST_DRAW_MS}); ` +
      `median frame ${figures.canvasFrameMedianMs} ms (floor ${figures.canvasFrameMedianFloorMs} ms, target ≤ ${TARGET_FRAME_MS})`,
  );
  console.log(JSON.stringify(figures));
}
