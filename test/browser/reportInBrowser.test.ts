/// <reference lib="dom" />
/**
 * Every example's report (boards and installations) opened in headless Chromium (Debian's `chromium`,
 * driven by playwright-core through its executable path): no console errors
 * and no network requests, every diagram has its phasors and no two labels
 * overlap as the browser lays them out, and in print layout on A4 and US
 * Letter no table is wider than the text block. Screenshots and PDFs are
 * saved in test/browser/artifacts/ (not committed).
 *
 * Without Chromium the test is skipped (its name says so), except under
 * CI=true, where a missing Chromium fails the run. TRIVAR_CHROMIUM overrides the path.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser } from 'playwright-core';
import { ROOT, runTrivar } from '../cli/runTrivar.js';
import { readdirSync } from 'node:fs';
import { isBoardExample } from '../support/boardExamples.js';

function findChromium(): string | null {
  const candidates = [process.env.TRIVAR_CHROMIUM, '/usr/bin/chromium', '/usr/bin/chromium-browser'].filter((p): p is string => Boolean(p));
  for (const c of candidates) if (existsSync(c)) return c;
  try {
    return execFileSync('sh', ['-c', 'command -v chromium || command -v chromium-browser'], { encoding: 'utf8' }).trim() || null;
  } catch {
    return null;
  }
}

const executablePath = findChromium();
const mustRun = process.env.CI === 'true';
const ARTIFACTS = join(ROOT, 'test/browser/artifacts');
const PROFILE_REPORT = 'quay-street-flats-with-profile';
const INSTALLATION_PROFILE_REPORT = 'osier-mill-studios-with-profile';
/** Every example (boards and installations, and any added later), plus a board's and an installation's report with profile sections. */
const examples = [
  ...readdirSync(join(ROOT, 'examples'))
    .filter((f) => f.endsWith('.yaml'))
    .map((f) => f.replace(/\.yaml$/, '')),
  PROFILE_REPORT,
  INSTALLATION_PROFILE_REPORT,
];
const installations = readdirSync(join(ROOT, 'examples'))
  .filter((f) => f.endsWith('.yaml') && !isBoardExample(join(ROOT, 'examples'))(f))
  .map((f) => f.replace(/\.yaml$/, ''));

/** Text block of the print stylesheet (14 mm margins) at 96 px per inch. */
const PAPER = [
  { name: 'A4', format: 'A4', textWidthPx: Math.floor(((210 - 28) / 25.4) * 96) },
  { name: 'Letter', format: 'Letter', textWidthPx: Math.floor(((215.9 - 28) / 25.4) * 96) },
] as const;

if (!executablePath && !mustRun) {
  describe.skip('reports in a browser — SKIPPED: Chromium not found (apt-get install chromium, or set TRIVAR_CHROMIUM; CI=true makes this a failure)', () => {
    it('needs Chromium', () => {});
  });
} else {
  describe(`reports in headless Chromium (${executablePath ?? 'missing'})`, () => {
    let browser: Browser;
    beforeAll(async () => {
      expect(executablePath, 'CI=true but Chromium was not found').not.toBeNull();
      mkdirSync(ARTIFACTS, { recursive: true });
      for (const name of examples) {
        if (name === PROFILE_REPORT || name === INSTALLATION_PROFILE_REPORT) continue;
        const r = runTrivar(['report', `examples/${name}.yaml`, '-o', join(ARTIFACTS, `${name}.html`)]);
        if (r.code !== 0) throw new Error(`trivar report failed for ${name}: ${r.stderr}`);
      }
      // One report with a load-profile section (a week of generated interval data).
      const data = join(ARTIFACTS, 'quay-street-week.csv');
      execFileSync(process.execPath, [join(ROOT, 'scripts/generate-profile-example.mjs'), data, '--days', '7'], { cwd: ROOT });
      const p = runTrivar(['report', 'examples/quay-street-flats.yaml', '--profile-data', data, '-o', join(ARTIFACTS, `${PROFILE_REPORT}.html`)]);
      if (p.code !== 0) throw new Error(`trivar report with profile data failed: ${p.stderr}`);
      // An installation's: an overview and a section per board (the invented mill's day of half-hours).
      const q = runTrivar(['report', 'examples/osier-mill-studios.yaml', '--profile-data', 'examples/osier-mill-day.csv', '-o', join(ARTIFACTS, `${INSTALLATION_PROFILE_REPORT}.html`)]);
      if (q.code !== 0) throw new Error(`trivar report of an installation with profile data failed: ${q.stderr}`);
      // Root (CI) cannot use Chromium's sandbox; the pages are trivar's own local files.
      browser = await chromium.launch({ executablePath: executablePath!, args: ['--no-sandbox', '--disable-gpu'] });
    }, 120_000);
    afterAll(async () => {
      await browser?.close();
    });

    it.each(examples)('%s: opens without console errors or network use, diagrams complete, labels apart', async (name) => {
      const page = await browser.newPage({ viewport: { width: 1000, height: 1200 } });
      const problems: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
      });
      page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
      page.on('request', (r) => {
        if (!r.url().startsWith('file://')) problems.push(`network request: ${r.url()}`);
      });
      await page.goto(`file://${join(ARTIFACTS, `${name}.html`)}`);
      await page.screenshot({ path: join(ARTIFACTS, `${name}-screen.png`), fullPage: true });

      const figures = await page.$$eval('figure[data-figure]', (els) =>
        els.map((fig) => {
          const svg = fig.querySelector('svg')!;
          const phasors = Array.from(svg.querySelectorAll('g.phasor')).map((g) => ({
            quantity: g.getAttribute('data-quantity'),
            phase: g.getAttribute('data-phase'),
            state: g.getAttribute('data-state'),
          }));
          const boxes = Array.from(svg.querySelectorAll('text.phasor-label, text.tree-text')).map((t) => {
            const b = (t as SVGGraphicsElement).getBBox();
            return { text: t.textContent ?? '', x: b.x, y: b.y, w: b.width, h: b.height };
          });
          const rect = svg.getBoundingClientRect();
          const emptyComponents = Array.from(svg.querySelectorAll('text.empty-component')).map((t) => t.getAttribute('data-component'));
          const curves = svg.querySelectorAll('polyline.series').length;
          const boards = svg.querySelectorAll('g.board').length;
          const feeders = svg.querySelectorAll('g.feeder polyline').length;
          return { name: fig.getAttribute('data-figure')!, view: svg.getAttribute('data-view'), phasors, emptyComponents, curves, boards, feeders, boxes, width: rect.width, height: rect.height };
        }),
      );
      await page.close();
      expect(problems).toEqual([]);
      expect(figures.length).toBeGreaterThanOrEqual(1);
      if (installations.includes(name) || name === INSTALLATION_PROFILE_REPORT) expect(figures.filter((f) => f.view === 'one-line'), 'an installation report has its one-line drawing').toHaveLength(1);
      for (const f of figures) {
        expect(f.width, `${f.name} is drawn`).toBeGreaterThan(100);
        const currents = f.phasors.filter((p) => p.quantity === 'current');
        if (f.view === 'phasors') {
          const voltages = f.phasors.filter((p) => p.quantity === 'voltage');
          expect(voltages.length, `${f.name} has a voltage per line`).toBeGreaterThanOrEqual(2);
          expect(currents.filter((p) => p.phase !== 'N').length, `${f.name} has a current per line`).toBe(voltages.length);
        }
        // Per row: 1 zero + 3 positive + 3 negative, less the components that are none (said in their panel, not drawn).
        if (f.view === 'sequence') expect(f.phasors).toHaveLength(14 - f.emptyComponents.reduce((n, c) => n + (c === 'zero' ? 1 : 3), 0));
        if (f.view === 'one-line') {
          expect(f.boards, `${f.name} draws every board`).toBeGreaterThanOrEqual(2);
          expect(f.feeders, `${f.name} draws a feeder to every board`).toBe(f.boards);
        }
        if (f.view === 'impedance-scan') expect(f.curves, `${f.name} has its curves`).toBeGreaterThan(0);
        if (f.view === 'triangles') expect(f.phasors.filter((p) => p.state === 'change').length).toBe(f.phasors.length / 3);
        const overlaps: string[] = [];
        f.boxes.forEach((a, i) =>
          f.boxes.slice(i + 1).forEach((b) => {
            const ox = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
            const oy = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
            if (ox > 0.5 && oy > 0.5) overlaps.push(`${a.text} / ${b.text}`);
          }),
        );
        expect(overlaps, `${f.name}: overlapping labels`).toEqual([]);
      }
    });

    it.each(examples.flatMap((name) => PAPER.map((p) => [name, p] as const)))('%s: print layout fits %s', async (name, paper) => {
      const page = await browser.newPage({ viewport: { width: paper.textWidthPx, height: 1100 } });
      await page.emulateMedia({ media: 'print' });
      await page.goto(`file://${join(ARTIFACTS, `${name}.html`)}`);
      const overflow = await page.evaluate(() => {
        const out: string[] = [];
        const limit = document.documentElement.clientWidth;
        for (const t of Array.from(document.querySelectorAll('table'))) {
          const r = t.getBoundingClientRect();
          if (r.right > limit + 0.5 || t.scrollWidth > t.parentElement!.clientWidth + 0.5) out.push(`${t.caption?.textContent ?? 'table'}: ${Math.round(r.width)} px in ${limit} px`);
        }
        for (const s of Array.from(document.querySelectorAll('figure svg'))) {
          const r = s.getBoundingClientRect();
          if (r.right > limit + 0.5) out.push(`figure ${s.getAttribute('data-view')}: ${Math.round(r.width)} px in ${limit} px`);
        }
        if (document.documentElement.scrollWidth > limit + 0.5) out.push(`page scrolls sideways: ${document.documentElement.scrollWidth} px in ${limit} px`);
        return out;
      });
      await page.screenshot({ path: join(ARTIFACTS, `${name}-print-${paper.name}.png`), fullPage: true });
      await page.pdf({ path: join(ARTIFACTS, `${name}-${paper.name}.pdf`), format: paper.format, printBackground: false });
      await page.close();
      expect(overflow).toEqual([]);
    });
  });
}
