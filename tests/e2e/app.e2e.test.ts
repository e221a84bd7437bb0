// The app end to end in Debian's Chromium (no GPU): the renderer as vite builds it, served on localhost.
// A user's path: demo → edit a dimension → short sweep → results → field slices → CSV export → open a
// file → cancel a run → reload with the edit restored → an invalid dimension explained at its field.
// Screenshots of each screen go to tests/e2e/screens/ (not committed).
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { parseCsv } from '../../engine/report/csv.ts';
import { buildRenderer, launchChromium, REPO, serveFolder } from './harness.ts';

const SCREENS = join(REPO, 'tests/e2e/screens');
let dir: string, server: { url: string; close(): Promise<void> }, browser: Browser, context: BrowserContext, page: Page;
const problems: string[] = [];

interface AppStores { run: { get(): { status: string; record: { points: { frequencyHz: number }[]; frequencies: { status: string }[] } } } }

const runState = () => page.evaluate(() => {
  const r = (window as unknown as { quietgridApp: AppStores }).quietgridApp.run.get();
  return { status: r.status, points: r.record.points.map((p) => p.frequencyHz), statuses: r.record.frequencies.map((f) => f.status) };
});
const field = (path: string) => page.locator(`.field[data-path="${path}"]`);
const input = (path: string) => field(path).locator('input');
const shot = (name: string) => page.screenshot({ path: join(SCREENS, `${name}.png`), fullPage: true });
/** The data of a plotly chart as drawn (plotly keeps it on the element). */
const plotData = (name: string) => page.evaluate((n) => {
  const el = document.querySelector(`[data-plot="${n}"]`) as (HTMLElement & { data?: { type: string; x: unknown[]; y: unknown[] }[]; layout?: { title?: { text?: string }; yaxis?: { title?: { text?: string } } } }) | null;
  return el?.data ? { traces: el.data.map((t) => ({ type: t.type, n: t.x?.length ?? 0 })), title: el.layout?.title?.text ?? '', yTitle: el.layout?.yaxis?.title?.text ?? '', drawn: Number(el.dataset.drawn ?? 0) } : null;
}, name);

// Polling checks on locators (vitest's expect has no locator matchers).
type Loc = ReturnType<Page['locator']>;
const hasText = (l: Loc, re: RegExp | string, timeout = 10_000) => expect.poll(() => l.first().textContent(), { timeout }).toMatch(re);
const hasCount = (l: Loc, n: number, timeout = 10_000) => expect.poll(() => l.count(), { timeout }).toBe(n);
const hasValue = (l: Loc, v: string) => expect.poll(() => l.inputValue()).toBe(v);
const hasAttribute = (l: Loc, name: string, v: string) => expect.poll(() => l.getAttribute(name)).toBe(v);

async function setList(text: string) {
  await page.click('#tab-sweep');
  await page.selectOption('.field[data-path="sweep.spacing"] select', 'list');
  await input('sweep.frequenciesHz').fill(text);
  await input('sweep.frequenciesHz').blur();
}

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'quietgrid-e2e-'));
  mkdirSync(SCREENS, { recursive: true });
  await buildRenderer(join(dir, 'site'));
  server = await serveFolder(join(dir, 'site'));
  browser = await launchChromium();
  context = await browser.newContext({ viewport: { width: 1440, height: 960 }, acceptDownloads: true });
  page = await context.newPage();
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  await page.goto(server.url);
  await page.waitForSelector('[data-view="plan"]');
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('quietgrid in the browser', () => {
  it('starts on a demo, drawn to scale, ready to run', async () => {
    await hasText(page.locator('.doc-title'), /expansion-chamber silencer/);
    expect(await page.locator('[data-view="plan"] .shape.section').count()).toBe(3);
    expect(await page.locator('button.run').isEnabled()).toBe(true);
  });

  it('is cross-origin isolated, so its workers may share memory (threads in one factorisation need it)', async () => {
    // Source: WHATWG HTML Living Standard, "crossOriginIsolated" (from memory for the section): true only with COOP same-origin and COEP require-corp
    expect(await page.evaluate(() => crossOriginIsolated && typeof SharedArrayBuffer === 'function')).toBe(true);
  });

  it('redraws the sketch when a dimension is edited', async () => {
    await input('duct.sections[1].length').fill('500');
    await hasCount(page.locator('[data-view="plan"] .dimension text', { hasText: /^500 mm$/ }), 1);
    await hasCount(page.locator('[data-view="plan"] .dimension text', { hasText: /^1300 mm$/ }), 1);
    await shot('sketch');
  });

  it('shows the mesh a short sweep implies', async () => {
    await setList('125, 250, 400');
    await hasCount(page.locator('.freq-chips .chip'), 3);
    await hasText(page.locator('.estimate td[data-key="Unknowns (dofs)"]'), /^\d[\d,]*$/, 20_000);
    await hasText(page.locator('.estimate td[data-key="Workers"]'), '2');
    await shot('sweep');
  });

  it('runs in workers and streams the results into the plot and tables', async () => {
    await page.click('button.run');
    await hasText(page.locator('[data-testid="run-status"]'), 'done', 60_000);
    expect((await runState()).points).toHaveLength(3);
    await page.click('#tab-results');
    await expect.poll(async () => (await plotData('spectrum'))?.traces[0]?.n, { timeout: 20_000 }).toBe(3);
    expect((await plotData('spectrum'))!.traces.every((t) => !t.type.endsWith('gl'))).toBe(true);
    await page.click('details.spectrum-table summary');
    await hasCount(page.locator('details.spectrum-table tbody tr'), 3);
    // a per-point output declared in engine/report/columns.ts shows up here as in spectrum.csv: the solve's residual
    await hasCount(page.locator('details.spectrum-table th', { hasText: 'Residual ‖Ax − b‖/‖b‖' }), 1);
    await hasText(page.locator('aside.cautions'), '29 CFR 1910.95');
    await hasText(page.locator('aside.cautions'), 'licensed professional');
    await shot('results');
  });

  it('slices the field, changes the plane and animates it', async () => {
    await page.click('#tab-field');
    await expect.poll(async () => (await plotData('slice'))?.title, { timeout: 20_000 }).toMatch(/plane z = /);
    expect((await plotData('slice'))!.traces[0].type).toBe('heatmap');
    await page.click('.segmented[aria-label="Plane normal"] button:has-text("y")');
    await expect.poll(async () => (await plotData('slice'))?.title, { timeout: 20_000 }).toMatch(/plane y = 0 mm/);
    expect((await plotData('slice'))!.yTitle).toBe('z, mm');
    await page.locator('#qg-slice-pos').fill('0.05');
    await expect.poll(async () => (await plotData('slice'))?.title, { timeout: 20_000 }).toMatch(/plane y = 50 mm/);
    await shot('field');
    await page.click('button:has-text("Animate")');
    await expect.poll(() => page.locator('[data-plot="slice"]').getAttribute('data-frame'), { timeout: 10_000 }).toMatch(/^\d+$/);
    const f1 = await page.locator('[data-plot="slice"]').getAttribute('data-frame');
    await expect.poll(() => page.locator('[data-plot="slice"]').getAttribute('data-frame')).not.toBe(f1);
    await shot('field-animation');
    await page.click('button:has-text("Stop")');
  });

  it('exports the spectrum and a slice as CSV', async () => {
    const [slice] = await Promise.all([page.waitForEvent('download'), page.click('button:has-text("Slice CSV")')]);
    const sliceRows = parseCsv(readFileSync((await slice.path())!, 'utf8'));
    expect(sliceRows[0]).toEqual(['x_m', 'y_m', 'z_m', 'p_re_pa', 'p_im_pa', 'spl_db']);
    expect(sliceRows.slice(1).every((r) => Number(r[1]) === 0.05)).toBe(true);
    expect(sliceRows.slice(1).some((r) => r[5] === '')).toBe(true); // solid corners of the plane are blank
    await page.click('#tab-results');
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('button:has-text("Spectrum CSV")')]);
    expect(download.suggestedFilename()).toBe('plant-room-supply-silencer-spectrum.csv');
    const rows = parseCsv(readFileSync((await download.path())!, 'utf8'));
    expect(rows[0].slice(0, 2)).toEqual(['frequency_hz', 'tl_db']);
    expect(rows.slice(1).map((r) => Number(r[0]))).toEqual([125, 250, 400]);
    expect(rows.slice(1).every((r) => Number.isFinite(Number(r[1])))).toBe(true);
    const [png] = await Promise.all([page.waitForEvent('download'), page.click('button:has-text("Plot PNG")')]);
    expect(png.suggestedFilename()).toBe('plant-room-supply-silencer-spectrum.png');
    // PNG signature (ISO/IEC 15948): 89 50 4E 47 0D 0A 1A 0A
    expect([...readFileSync((await png.path())!).subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  });

  it('opens a scenario file and lists it among the recent files', async () => {
    await page.locator('[data-testid="open-file"]').setInputFiles(join(REPO, 'scenarios/kitchen-extract-stub-resonator.json'));
    await hasText(page.locator('.doc-title'), /quarter-wave stub/);
    await hasCount(page.locator('select[aria-label="Open a recent file"] option', { hasText: 'kitchen-extract-stub-resonator.json' }), 1);
    // Dropped on the window, a scenario file opens the same way.
    const text = readFileSync(join(REPO, 'scenarios/generator-room-small.json'), 'utf8');
    await page.evaluate((t) => {
      const dt = new DataTransfer();
      dt.items.add(new File([t], 'dropped-room.json', { type: 'application/json' }));
      document.querySelector('.app')!.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, text);
    await hasText(page.locator('.doc-title'), /generator room/);
    await hasText(page.locator('.doc-file'), 'dropped-room.json');
    expect(await page.locator('[data-view="plan"] .marker.receiver').count()).toBe(2);
    await page.selectOption('select[aria-label="Load a demo scenario"]', 'plant-room-supply-silencer');
    await hasText(page.locator('.doc-title'), /expansion-chamber silencer/);
  });

  it('cancels a run at once and keeps what finished', async () => {
    await setList('100, 125, 160, 200, 250, 315, 400, 500');
    await page.waitForFunction(() => {
      const r = (window as unknown as { quietgridApp: AppStores }).quietgridApp.run.get();
      return r.status === 'done' || r.status === 'cancelled';
    });
    await page.click('button.run');
    await page.waitForFunction(() => (window as unknown as { quietgridApp: AppStores }).quietgridApp.run.get().record.points.length >= 1, null, { timeout: 60_000 });
    // The click terminates the workers synchronously: the state is final before the handler returns.
    const after = await page.evaluate(() => {
      (document.querySelector('button.cancel') as HTMLButtonElement).click();
      return (window as unknown as { quietgridApp: AppStores }).quietgridApp.run.get().status;
    });
    expect(after).toBe('cancelled');
    const r = await runState();
    expect(r.points.length).toBeGreaterThanOrEqual(1);
    expect(r.points.length).toBeLessThan(8);
    expect(r.statuses.filter((s) => s === 'unsolved').length).toBe(8 - r.points.length);
    await hasCount(page.locator('.segments li.unsolved:not(.check)'), 8 - r.points.length);
    await page.click('#tab-results');
    await expect.poll(async () => (await plotData('spectrum'))?.traces[0]?.n).toBe(r.points.length);
    await hasText(page.locator('[data-testid="results-summary"]'), 'cancelled');
    await shot('cancelled');
  });

  it('restores an unsaved edit after a reload', async () => {
    await page.click('#tab-sketch');
    await input('duct.sections[1].width').fill('480');
    await page.reload();
    await page.waitForSelector('[data-view="plan"]');
    await hasValue(input('duct.sections[1].width'), '480');
    await hasText(page.locator('.banner.info'), 'Restored the unsaved edits');
    await hasText(page.locator('.doc-file'), 'edited');
  });

  it('explains an invalid dimension at its field and disables the run with the reason', async () => {
    await input('duct.sections[1].width').fill('-5');
    await hasText(field('duct.sections[1].width').locator('.issue'), /^The section width \(along y\) must be between 0.001 and 10000 m; fix: /);
    await hasAttribute(input('duct.sections[1].width'), 'aria-invalid', 'true');
    await expect.poll(() => page.locator('button.run').isDisabled()).toBe(true);
    await hasText(page.locator('#qg-run-blocker'), 'Cannot run: one problem in the scenario. First: duct.sections[1].width = -0.005');
    await hasText(page.locator('.stale'), 'last valid sketch');
    await shot('invalid');
  });

  it('ran without a console error or a blocked resource', () => {
    expect(problems).toEqual([]);
  });
});
