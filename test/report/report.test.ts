/**
 * The run's HTML report in headless Chromium (Debian's /usr/bin/chromium
 * driven by playwright-core): the page opens with no console errors and no
 * network request, every image has loaded (naturalWidth > 0), the headline
 * numbers shown equal those in results.json, and a screenshot is saved in
 * the output folder (test/report/output/). The sections come in reading
 * order, and in both spectrum figures the legend's box overlaps no data
 * path's box (common practice, no source). Under CI=true a missing Chromium
 * fails the test; otherwise it is skipped.
 */
import { existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { chromium } from 'playwright-core';
import { runPlan } from '../../src/plan/runPlan.js';
import { makePlanFixture } from '../plan/fixture.js';
import { tempDir } from '../helpers/tempDir.js';

const CHROMIUM = '/usr/bin/chromium';
const have = existsSync(CHROMIUM);
if (!have && process.env.CI === 'true') throw new Error(`${CHROMIUM} is missing; CI needs it for the report test`);

describe.skipIf(!have)('report in headless Chromium', () => {
  it('opens cleanly, shows every image and the numbers of results.json', async () => {
    const fx = makePlanFixture({ extra: 'forecast:\n  footprint: measured\n  energiesTeV: [40, 100, 200]' });
    const out = join(fx.dir, 'out');
    const run = await runPlan(fx.plan, { outDir: out, cache: false });
    const results = JSON.parse(readFileSync(run.results, 'utf8'));
    // a fresh profile folder per run (playwright passes it as --user-data-dir)
    const browser = await chromium.launchPersistentContext(tempDir('skyspan-chromium-'), {
      executablePath: CHROMIUM, headless: true, viewport: { width: 1100, height: 900 },
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
        '--disable-component-update', '--disable-sync'],
    });
    try {
      const page = await browser.newPage();
      const problems: string[] = [], requests: string[] = [];
      page.on('console', (m) => { if (m.type() === 'error') problems.push(m.text()); });
      page.on('pageerror', (e) => problems.push(e.message));
      page.on('request', (r) => { if (!r.url().startsWith('file:') && !r.url().startsWith('data:')) requests.push(r.url()); });
      await page.goto(pathToFileURL(run.report!).href, { waitUntil: 'load' });
      const images = await page.$$eval('img', (els) => els.map((e) => ({ w: (e as unknown as { naturalWidth: number }).naturalWidth, done: (e as unknown as { complete: boolean }).complete })));
      expect(images.length).toBeGreaterThanOrEqual(2);
      for (const im of images) { expect(im.done).toBe(true); expect(im.w).toBeGreaterThan(0); }
      const shown = async (id: string) => page.$eval(`#${id} .value`, (e) => e.textContent ?? '');
      const h = results.headline;
      expect(await shown('kf-ratio')).toBe(h.ratioMedian.toPrecision(3));
      expect(await shown('kf-ratio-low')).toBe(h.ratioP16.toPrecision(3));
      expect(await shown('kf-ratio-high')).toBe(h.ratioP84.toPrecision(3));
      expect(await shown('kf-tension')).toBe(h.tensionSigma.toFixed(2));
      // the same figures as the comparison record (compare layer's numbers, not the headline's copy)
      expect(Number(await shown('kf-ratio'))).toBeCloseTo(results.comparison.ratio.median, 2 - Math.floor(Math.log10(results.comparison.ratio.median)));
      const headline = await page.$eval('#headline', (e) => e.textContent ?? '');
      expect(headline).toContain(h.ratioMedian.toPrecision(3));
      expect(headline).toContain(`${h.tensionSigma.toFixed(2)} sigma`);
      // Reading order: headline, scaled results, regions, footprint picture, spectra, then the tables.
      const tops = await page.$$eval(['#headline', '#scaled', '#regions', '#fig-footprint', '#fig-spectrum', '#tables'].join(','),
        (els) => els.map((e) => [e.id, e.getBoundingClientRect().top] as [string, number]));
      expect(tops.map(([id]) => id)).toEqual(['headline', 'scaled', 'regions', 'fig-footprint', 'fig-spectrum', 'tables']);
      for (let i = 1; i < tops.length; i++) expect(tops[i][1]).toBeGreaterThan(tops[i - 1][1]);
      // No legend box overlaps a data path's box, in each spectrum figure as the browser lays it out.
      for (const name of ['spectrum.svg', 'forecast.svg']) {
        const fig = await browser.newPage();
        await fig.setContent(readFileSync(join(out, name), 'utf8'));
        type Box = { l: number; r: number; t: number; b: number };
        const boxesOf = (sel: string) => fig.$$eval(sel, (els) => els.map((e) => {
          const r = (e as unknown as { getBoundingClientRect(): { left: number; right: number; top: number; bottom: number } }).getBoundingClientRect();
          return { l: r.left, r: r.right, t: r.top, b: r.bottom } as Box;
        }));
        const legends = await boxesOf('[data-role="legend"]');
        const boxes = { legend: legends[0] ?? null,
          data: await boxesOf('[data-role="band"],[data-role="band-central"],[data-role="point"],[data-role="upper-limit"],[data-role="error-bar"]') };
        await fig.close();
        expect(boxes.legend).not.toBeNull();
        expect(boxes.data.length).toBeGreaterThan(0);
        const L = boxes.legend!;
        for (const d of boxes.data) expect(d.r <= L.l || d.l >= L.r || d.b <= L.t || d.t >= L.b).toBe(true);
      }
      const shotDir = join(import.meta.dirname, 'output');
      mkdirSync(shotDir, { recursive: true });
      const shot = join(shotDir, 'report.png');
      await page.screenshot({ path: shot, fullPage: true });
      expect(statSync(shot).size).toBeGreaterThan(10000);
      expect(problems).toEqual([]);
      expect(requests).toEqual([]);
    } finally {
      await browser.close();
    }
  }, 90000);
});
