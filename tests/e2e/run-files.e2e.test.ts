// The operator's run files in Chromium: a program released through the API (the flow of
// tests/server/programs.test.ts), downloaded through the page and checked against the SHA-256 the
// page shows; the set-up sheet on screen and as printed. Screenshots land in tests/e2e/screenshots/.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { sampleFile, sampleLibrary, sampleSettings } from '../helpers/programs';
import { makeUser, signedInAgent, TEST_PASSWORD } from '../helpers/test-app';

let h: BrowserHarness;
type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let author: Agent;
let reviewer: Agent;
const PROGRAM = `led-strip-e2e-${Date.now().toString(36)}`;
let revA = '';
let revB = '';

async function detail(a: Agent, revId: string) {
  const res = await a.a.get(`/api/revisions/${revId}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

async function checkSubmitApprove(revId: string) {
  const chk = await author.a.post(`/api/revisions/${revId}/checks`).set('X-CSRF-Token', author.token);
  expect(chk.status, JSON.stringify(chk.body)).toBe(200);
  const sub = await author.a.post(`/api/revisions/${revId}/submit`).set('X-CSRF-Token', author.token);
  expect(sub.status, JSON.stringify(sub.body)).toBe(200);
  const ok = await reviewer.a.post(`/api/revisions/${revId}/approve`).set('X-CSRF-Token', reviewer.token).send({ comment: 'LED orientation checked on the drawing.' });
  expect(ok.status, JSON.stringify(ok.body)).toBe(200);
  expect(ok.body.state).toBe('released');
}

beforeAll(async () => {
  h = await startBrowserHarness();
  const { ctx } = h;
  author = await signedInAgent(ctx, ['engineer']);
  reviewer = await signedInAgent(ctx, ['engineer']);
  const admin = await signedInAgent(ctx, ['admin']);
  // Merge, not replace: the browser tests share one database (seeded with the starter library), and
  // vitest may run the files in any order.
  const lib = await admin.a.post('/api/library/import').set('X-CSRF-Token', admin.token).send({ file: sampleLibrary(), mode: 'merge' });
  expect(lib.status, JSON.stringify(lib.body)).toBe(200);

  const created = await author.a.post('/api/programs').set('X-CSRF-Token', author.token).send({ name: PROGRAM, product: 'LED status strip', board: 'HCI-LS2 rev A' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  revA = created.body.revisions[0].id;
  const d0 = await detail(author, revA);
  const up = await author.a
    .post(`/api/revisions/${revA}/centroid`)
    .set('X-CSRF-Token', author.token)
    .field('options', JSON.stringify({}))
    .field('version', String(d0.version))
    .attach('file', sampleFile('led-strip/led-strip.csv'), 'led-strip.csv');
  expect(up.status, JSON.stringify(up.body)).toBe(200);
  const d1 = await detail(author, revA);
  const set = await author.a.put(`/api/revisions/${revA}/settings`).set('X-CSRF-Token', author.token).send({ settings: sampleSettings('led-strip/job.json'), version: d1.version });
  expect(set.status, JSON.stringify(set.body)).toBe(200);
  await checkSubmitApprove(revA);

  // A second release, so that A is superseded by B.
  const next = await author.a.post(`/api/programs/${created.body.id}/revisions`).set('X-CSRF-Token', author.token);
  expect(next.status, JSON.stringify(next.body)).toBe(201);
  revB = next.body.id;
  await checkSubmitApprove(revB);
}, 120_000);
afterAll(async () => {
  await h?.close();
});

async function signInOperator(page: Page) {
  const op = await makeUser(h.ctx.ds, ['operator'], { name: 'Otis Fenn' });
  await signInAs(page, h.baseUrl, op.email, TEST_PASSWORD);
}

describe('run files in Chromium', () => {
  it('an operator downloads the current CSV through the page; its SHA-256 is the one shown', async () => {
    const page = await h.newPage();
    try {
      await signInOperator(page);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Run files' }).click();
      await page.getByRole('heading', { name: 'Run files', level: 1 }).waitFor();
      const program = page.getByRole('region', { name: `Program ${PROGRAM}` });
      const cards = program.getByRole('article');
      await cards.first().waitFor();
      expect(await cards.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label')))).toEqual([`${PROGRAM} B (current)`, `${PROGRAM} A (superseded)`]);
      await expect(cards.nth(1).getByText(/superseded by/).textContent()).resolves.toBe('superseded by B — do not load');
      await expect(page.getByRole('complementary', { name: 'Safety' }).textContent()).resolves.toMatch(/lead/);

      const current = cards.first();
      const row = current.getByRole('row').filter({ hasText: 'Top CSV' });
      const shown = (await row.locator('[data-sha256]').textContent())!.trim();
      expect(shown).toMatch(/^[0-9a-f]{64}$/);
      const [download] = await Promise.all([page.waitForEvent('download'), current.getByRole('link', { name: `Download Top CSV of ${PROGRAM} B` }).click()]);
      expect(download.suggestedFilename()).toBe(`${PROGRAM}-B-top.csv`);
      const path = await download.path();
      const text = readFileSync(path, 'utf8');
      // A CSV's SHA-256 covers every byte after the metadata lines, header row included
      // (shared/placement-list/README.md), and the file names it in its own `# sha256:` line.
      const body = text.slice(text.indexOf('seq,board,ref,'));
      expect(createHash('sha256').update(body, 'utf8').digest('hex')).toBe(shown);
      expect(/^# sha256: ([0-9a-f]{64})$/m.exec(text)![1]).toBe(shown);

      // A JSON list's SHA-256 is that of the whole file.
      const jsonShown = (await current.getByRole('row').filter({ hasText: 'Top JSON' }).locator('[data-sha256]').textContent())!.trim();
      const [jsonDl] = await Promise.all([page.waitForEvent('download'), current.getByRole('link', { name: `Download Top JSON of ${PROGRAM} B` }).click()]);
      expect(createHash('sha256').update(readFileSync(await jsonDl.path())).digest('hex')).toBe(jsonShown);

      await page.screenshot({ path: `${SCREENSHOT_DIR}/run-files-operator.png`, fullPage: true });

      // Report a problem: field error first, then a toast.
      await current.getByRole('button', { name: 'Report a problem' }).click();
      const form = current.getByRole('form', { name: `Report a problem with ${PROGRAM} B` });
      await form.getByLabel('What went wrong?').fill('skewed');
      await form.getByRole('button', { name: 'Send report' }).click();
      await form.getByText('Describe the problem (at least 10 characters)').waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/run-files-problem-error.png` });
      await form.getByLabel('What went wrong?').fill('D3 on board 7 sits 0.4 mm left of its pads.');
      await form.getByRole('button', { name: 'Send report' }).click();
      await page.getByText(`the author of ${PROGRAM} B has been told`).waitFor();
    } finally {
      await page.close();
    }
  });

  it('the set-up sheet shows the program, checksums, fiducials and parts, and prints without navigation', async () => {
    const page = await h.newPage();
    try {
      await signInOperator(page);
      await page.goto(`${h.baseUrl}/run-files`);
      const current = page.getByRole('article', { name: `${PROGRAM} B (current)` });
      await current.getByRole('link', { name: 'Set-up sheet' }).click();
      await page.getByRole('heading', { level: 1, name: `${PROGRAM} B` }).waitFor();
      expect(new URL(page.url()).pathname).toBe(`/run-files/${revB}/setup-sheet`);
      // the LED strip panel: 4 × 5 = 20 boards, top and bottom sides
      await page.getByRole('region', { name: 'Top side' }).waitFor();
      await page.getByRole('region', { name: 'Bottom side' }).waitFor();
      await expect(page.getByRole('region', { name: 'Top side' }).textContent()).resolves.toMatch(/on 20 boards/);
      const fid = page.getByRole('table', { name: 'Top fiducials' });
      expect(await fid.getByRole('row').count()).toBe(4); // header + PT1..PT3
      expect(await fid.textContent()).toMatch(/\d+\.\d{3} mm/);
      // every Top-side placement is in one group: the parts table's total is the list's count
      const total = await page.getByRole('table', { name: 'Top parts' }).locator('tfoot td').nth(1).textContent();
      const api = await author.a.get('/api/run-files').expect(200);
      const topCsv = api.body.items.find((r: { revisionId: string }) => r.revisionId === revB).files.find((f: { side: string; format: string }) => f.side === 'top' && f.format === 'csv');
      expect(Number(total)).toBe(topCsv.placements);
      await expect(page.locator('[data-sha256]').first().textContent()).resolves.toBe(topCsv.sha256);
      await page.getByRole('button', { name: 'Print' }).waitFor();

      await page.screenshot({ path: `${SCREENSHOT_DIR}/setup-sheet-screen.png`, fullPage: true });
      await page.emulateMedia({ media: 'print' });
      expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
      expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
      const colour = await page.getByRole('heading', { level: 1 }).evaluate((el) => getComputedStyle(el).color);
      expect(colour).toBe('rgb(0, 0, 0)');
      const breaks = await page.getByRole('region', { name: 'Bottom side' }).evaluate((el) => getComputedStyle(el).breakBefore);
      expect(breaks).toBe('page');
      // A4 less 12 mm margins each side is 186 mm ≈ 703 CSS px wide (96 px per inch).
      await page.setViewportSize({ width: 703, height: 1000 });
      await page.screenshot({ path: `${SCREENSHOT_DIR}/setup-sheet-print.png`, fullPage: true });
      await page.setViewportSize({ width: 1360, height: 860 });
      // Printed to A4 (Chromium's own print path): the bottom side starts a page of its own.
      const pdf = await page.pdf({ path: `${SCREENSHOT_DIR}/setup-sheet.pdf`, format: 'A4', printBackground: false });
      expect(pdf.toString('latin1').match(/\/Type\s*\/Page\b/g)?.length ?? 0).toBeGreaterThanOrEqual(2);
      await page.emulateMedia({ media: 'screen' });

      // The superseded revision's sheet says so.
      await page.goto(`${h.baseUrl}/run-files/${revA}/setup-sheet`);
      await page.getByText('This revision is superseded.').waitFor();
    } finally {
      await page.close();
    }
  });

  it('an engineer creates a line token, sees it once, downloads with it, and revokes it', async () => {
    const page = await h.newPage();
    try {
      const eng = await makeUser(h.ctx.ds, ['engineer'], { name: 'Ines Calder' });
      await signInAs(page, h.baseUrl, eng.email, TEST_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Line access' }).click();
      await page.getByRole('heading', { name: 'Line access', level: 1 }).waitFor();
      await page.getByRole('button', { name: 'New token' }).click();
      const form = page.getByRole('form', { name: 'New line token' });
      await form.getByRole('button', { name: 'Create token' }).click();
      await form.getByText('Name the computer or script that will use it').waitFor();
      await form.getByLabel('Name').fill('Line B loader PC');
      await form.getByRole('button', { name: 'Create token' }).click();
      const token = (await page.getByTestId('new-token').textContent())!.trim();
      expect(token).toMatch(/^pwt_/);
      // the example names a real download URL once the run-file list has loaded
      await expect.poll(() => page.getByRole('region', { name: 'New token' }).textContent()).toMatch(/curl -fsS -H "Authorization: Bearer pwt_\S+" -OJ "http:\/\/127\.0\.0\.1:\d+\/api\/run-files\/[0-9a-f-]{36}\/top\.csv"/);
      await page.screenshot({ path: `${SCREENSHOT_DIR}/tokens-created.png`, fullPage: true });

      // The token opens the download route (and only that).
      const res = await fetch(`${h.baseUrl}/api/run-files/${revB}/top.csv`, { headers: { Authorization: `Bearer ${token}` } });
      expect(res.status).toBe(200);
      const csv = await res.text();
      expect(createHash('sha256').update(csv.slice(csv.indexOf('seq,board,ref,')), 'utf8').digest('hex')).toBe(res.headers.get('x-content-sha256'));
      expect((await fetch(`${h.baseUrl}/api/run-files`, { headers: { Authorization: `Bearer ${token}` } })).status).toBe(403);

      await page.getByRole('button', { name: 'I have stored it' }).click();
      await expect(page.getByTestId('new-token').count()).resolves.toBe(0);
      const row = page.getByRole('row').filter({ hasText: 'Line B loader PC' });
      await row.getByRole('button', { name: 'Revoke…' }).click();
      await row.getByRole('group', { name: 'Revoke Line B loader PC?' }).getByRole('button', { name: 'Revoke' }).click();
      await row.getByText('revoked').waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/tokens-revoked.png`, fullPage: true });
      expect((await fetch(`${h.baseUrl}/api/run-files/${revB}/top.csv`, { headers: { Authorization: `Bearer ${token}` } })).status).toBe(401);
    } finally {
      await page.close();
    }
  });
});
