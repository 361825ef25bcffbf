/**
 * The HTML report in a real browser: Debian's Chromium (installed by .ci/run when missing), driven
 * by playwright-core with the system browser. Loads a report of the committed demo and logistic
 * r = 3.83 certificates plus one tampered file, takes screenshots at two widths into
 * artifacts/report-screenshots/ (gitignored; README "report" section), and asserts on the DOM.
 * A second page holds a folder with every certificate kind, written by the real commands
 * (kinds-fixture.ts): window, fold and flip edges, absence, count, flow; one screenshot per kind.
 * Skipped, saying so, only when no Chromium binary exists on this machine.
 */
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { collectEntries, renderReportHtml } from '../../src/report/index.js';
import { writeKindSamples } from './kinds-fixture.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
export const SCREENSHOT_DIR = join(root, 'artifacts', 'report-screenshots');

function findChromium(): string | undefined {
  const candidates = [process.env.ORBITSEAL_CHROMIUM, '/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome'];
  return candidates.find((p): p is string => !!p && existsSync(p));
}
const chromiumPath = findChromium();
if (!chromiumPath) console.warn('report browser test skipped: no Chromium binary found (apt-get install -y chromium; .ci/run installs it)');

const work = mkdtempSync(join(tmpdir(), 'orbitseal-report-browser-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe.skipIf(!chromiumPath)('report in headless Chromium', () => {
  it('shows every certificate with its boxes, loads nothing, logs no error (screenshots at 1280 and 420 px)', async () => {
    // one tampered certificate: a changed multiplier end must show as REJECTED with no claim
    const tampered = join(work, 'tampered.json');
    copyFileSync(join(root, 'proofs/logistic/r3.83/logistic-map-p3-1.json'), tampered);
    writeFileSync(tampered, readFileSync(tampered, 'utf8').replace('"0.3298816', '"0.3198816'));
    const entries = collectEntries([join(root, 'proofs/demo'), join(root, 'proofs/logistic/r3.83'), tampered], root);
    expect(entries.map((e) => e.verdict).filter((v) => v !== 'VERIFIED')).toEqual(['REJECTED']);
    const { html, plots } = renderReportHtml(entries, { title: 'orbitseal report (browser test)' });
    const file = join(work, 'report.html');
    writeFileSync(file, html);
    const url = pathToFileURL(file).href;

    const { chromium } = await import('playwright-core');
    const browser = await chromium.launch({ executablePath: chromiumPath, args: ['--no-sandbox'] });
    try {
      mkdirSync(SCREENSHOT_DIR, { recursive: true });
      for (const width of [1280, 420]) {
        const page = await browser.newPage({ viewport: { width, height: 900 } });
        const consoleErrors: string[] = [];
        const requests: string[] = [];
        page.on('console', (m) => {
          if (m.type() === 'error') consoleErrors.push(m.text());
        });
        page.on('pageerror', (e) => consoleErrors.push(String(e)));
        page.on('request', (r) => requests.push(r.url()));
        await page.goto(url, { waitUntil: 'load' });

        // every certificate present, in order, with its verdict
        const sections = await page.$$eval('section.certificate', (els) =>
          els.map((el) => ({
            file: el.getAttribute('data-file'),
            verdict: el.getAttribute('data-verdict'),
            plots: [...el.querySelectorAll('figure')].map((f) => ({
              boxes: Number(f.getAttribute('data-boxes')),
              drawn: f.querySelectorAll('.proof-box, .enclosure').length,
              labelled: !!f.querySelector('svg[role="img"] > title') && !!f.querySelector('svg > desc'),
              caption: (f.querySelector('figcaption')?.textContent ?? '').length,
            })),
            claim: el.querySelector('.claim')?.textContent ?? '',
          })),
        );
        expect(sections.map((s) => s.file)).toEqual(entries.map((e) => e.file));
        expect(sections.map((s) => s.verdict)).toEqual(entries.map((e) => e.verdict));
        for (const s of sections) {
          if (s.verdict === 'VERIFIED') {
            expect(s.plots.length, s.file!).toBeGreaterThanOrEqual(2); // orbit plot + unit circle
            for (const p of s.plots) {
              expect(p.drawn, s.file!).toBeGreaterThan(0);
              expect(p.drawn).toBe(p.boxes);
              expect(p.labelled).toBe(true);
              expect(p.caption).toBeGreaterThan(40);
            }
          } else {
            expect(s.plots).toEqual([]);
            expect(s.claim).toMatch(/^Nothing in this file is proven/);
          }
        }
        // the orbit plot draws one box per orbit point: vole 1, 1, 2; moth 1, 1, 3, 3; logistic 1, 1, 3, 3
        const orbitBoxes = sections.filter((s) => s.verdict === 'VERIFIED').map((s) => s.plots[0]!.boxes);
        expect(orbitBoxes).toEqual([1, 1, 2, 1, 1, 3, 3, 1, 1, 3, 3]);

        // the bifurcation diagrams: logistic r = 3.83 and the moth census, 1 + 1 + 3 + 3 boxes each
        const bif = await page.$$eval('section.bifurcation figure', (els) => els.map((f) => f.querySelectorAll('.proof-box').length));
        expect(bif).toEqual([8, 8]);
        const grey = await page.$$eval('section.bifurcation path.float-orbits', (els) => els.map((p) => (p.getAttribute('d') ?? '').length));
        expect(grey.every((n) => n > 1000)).toBe(true);

        // the fixed point 0 of x ↦ r x (1 − x) has multiplier f'(0) = r = 3.83 (closed form, derived by hand)
        const fixed0 = await page.$$eval('section.certificate', (els) =>
          els.filter((el) => /logistic-map-p1-1/.test(el.getAttribute('data-file') ?? '')).map((el) => el.querySelector('.claim')?.textContent ?? ''),
        );
        const m = /Λ ∈ \[([-\d.e]+), ([-\d.e]+)\]/.exec(fixed0[0]!)!;
        expect(Number(m[1])).toBeLessThanOrEqual(3.83);
        expect(Number(m[2])).toBeGreaterThanOrEqual(3.83);

        // nothing but the page itself was requested; no console error (a CSP violation would be one)
        expect(requests).toEqual([url]);
        expect(consoleErrors).toEqual([]);

        // layout: at 420 px the page does not scroll sideways (tables scroll inside their box)
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        expect(overflow).toBeLessThanOrEqual(0);

        await page.screenshot({ path: join(SCREENSHOT_DIR, `report-${width}-top.png`) });
        await page.locator('section.bifurcation').first().screenshot({ path: join(SCREENSHOT_DIR, `report-${width}-bifurcation.png`) });
        await page.locator('section.certificate').nth(2).screenshot({ path: join(SCREENSHOT_DIR, `report-${width}-phase-plane.png`) });
        await page.locator('section.certificate').nth(5).screenshot({ path: join(SCREENSHOT_DIR, `report-${width}-cobweb.png`) });
        await page.screenshot({ path: join(SCREENSHOT_DIR, `report-${width}-full.png`), fullPage: true });
        await page.close();
      }
      expect(plots.length).toBeGreaterThan(20);
    } finally {
      await browser.close();
    }
  }, 90_000);
  it('a folder with every certificate kind: each view with its plots, the diagram overlays, no sideways scroll at 420 px', async () => {
    const samples = await writeKindSamples(join(work, 'kinds'));
    const entries = collectEntries([join(root, 'proofs/logistic/r3.83/logistic-map-p3-1.json'), samples.dir], work);
    const { html } = renderReportHtml(entries, { title: 'orbitseal report — every kind (browser test)' });
    const file = join(work, 'kinds.html');
    writeFileSync(file, html);
    const url = pathToFileURL(file).href;
    const kinds = ['periodic-orbit', 'periodic-window', 'bifurcation-edge', 'periodic-absence', 'periodic-orbit-count'];

    const { chromium } = await import('playwright-core');
    const browser = await chromium.launch({ executablePath: chromiumPath, args: ['--no-sandbox'] });
    try {
      mkdirSync(SCREENSHOT_DIR, { recursive: true });
      for (const width of [1280, 420]) {
        const page = await browser.newPage({ viewport: { width, height: 900 } });
        const problems: string[] = [];
        const requests: string[] = [];
        page.on('console', (m) => {
          if (m.type() === 'error') problems.push(m.text());
        });
        page.on('pageerror', (e) => problems.push(String(e)));
        page.on('request', (r) => requests.push(r.url()));
        await page.goto(url, { waitUntil: 'load' });
        const sections = await page.$$eval('section.certificate', (els) =>
          els.map((el) => ({
            kind: el.getAttribute('data-kind'),
            verdict: el.getAttribute('data-verdict'),
            file: el.getAttribute('data-file'),
            claim: el.querySelector('.claim')?.textContent ?? '',
            plots: [...el.querySelectorAll('figure')].map((f) => ({
              boxes: Number(f.getAttribute('data-boxes')),
              drawn: f.querySelectorAll('.proof-box, .enclosure, .cover-leaf').length,
              labelled: !!f.querySelector('svg[role="img"] > title') && !!f.querySelector('svg > desc'),
            })),
          })),
        );
        expect(sections.map((x) => x.file)).toEqual(entries.map((e) => e.file));
        // every kind but flows is re-verified by the checker and shown with its view
        for (const kind of kinds) expect(sections.some((x) => x.kind === kind && x.verdict === 'VERIFIED'), kind).toBe(true);
        for (const x of sections) {
          if (x.verdict !== 'VERIFIED') {
            expect(x.plots, x.file!).toEqual([]);
            expect(x.claim).toMatch(/^Nothing in this file is proven/);
            continue;
          }
          expect(x.plots.length, x.file!).toBeGreaterThanOrEqual(1);
          expect(x.claim).toMatch(/re-verified by the independent checker\.$/);
          for (const p of x.plots) {
            expect(p.drawn, x.file!).toBe(p.boxes);
            expect(p.drawn, x.file!).toBeGreaterThan(0);
            expect(p.labelled).toBe(true);
          }
        }
        // the flow certificate: a view when the checker verifies flows, otherwise no claim at all
        const flow = sections.find((x) => x.file!.includes('vibrating-sensor-bracket'))!;
        if (flow.verdict === 'VERIFIED') expect(flow.plots.length).toBeGreaterThanOrEqual(2);
        else expect(flow.claim).toMatch(/^Nothing in this file is proven/);

        // the logistic diagram: orbits at 3.83, the window band, its gaps, the absence and both edges
        const diagram = await page.$$eval('section.bifurcation svg', (els) =>
          els.map((svg) => ({
            window: svg.querySelectorAll('.band-window').length,
            gaps: svg.querySelectorAll('.band-gap').length,
            absence: svg.querySelectorAll('.band-absence').length,
            edges: svg.querySelectorAll('.edge-mark').length,
          })),
        );
        expect(diagram).toHaveLength(1);
        expect(diagram[0]!.window).toBe(1);
        expect(diagram[0]!.gaps).toBeGreaterThan(0);
        expect(diagram[0]!.absence).toBe(1);
        expect(diagram[0]!.edges).toBe(2);

        expect(requests).toEqual([url]);
        expect(problems).toEqual([]);
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        expect(overflow).toBeLessThanOrEqual(0);

        await page.locator('section.bifurcation').first().screenshot({ path: join(SCREENSHOT_DIR, `kinds-${width}-bifurcation.png`) });
        for (const kind of kinds.slice(1)) {
          await page.locator(`section.certificate[data-kind="${kind}"]`).first().screenshot({ path: join(SCREENSHOT_DIR, `kinds-${width}-${kind}.png`) });
        }
        // a REJECTED file has no kind attribute (nothing in it is read as a claim): found by name
        await page.locator('section.certificate[data-file*="vibrating-sensor-bracket"]').screenshot({ path: join(SCREENSHOT_DIR, `kinds-${width}-flow-periodic-orbit.png`) });
        await page.close();
      }
    } finally {
      await browser.close();
    }
  }, 120_000);
});
