/**
 * Renders assets/screenshot-main.png for the README: the app in Chromium (no GPU) with a real result,
 * the expansion-chamber demo's own sweep solved, octave bands with the outlet sound power.
 *   npx tsx scripts/screenshot-main.ts
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildRenderer, launchChromium, REPO, serveFolder } from '../tests/e2e/harness.ts';

const dir = mkdtempSync(join(tmpdir(), 'quietgrid-shot-'));
try {
  await buildRenderer(join(dir, 'site'));
  const server = await serveFolder(join(dir, 'site'));
  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await page.goto(server.url);
    await page.waitForSelector('[data-view="plan"]');
    await page.click('button.run');
    await page.waitForFunction(() => document.querySelector('[data-testid="run-status"]')?.textContent?.includes('done'), null, { timeout: 120_000 });
    await page.click('#tab-results');
    await page.click('.bands-head button:has-text("Octave")');
    await page.waitForFunction(() => Number(document.querySelector('[data-plot="power"]')?.getAttribute('data-drawn') ?? 0) > 0);
    await page.waitForTimeout(300);
    await page.screenshot({ path: join(REPO, 'assets/screenshot-main.png') });
    console.log('wrote assets/screenshot-main.png');
  } finally {
    await browser.close();
    await server.close();
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
