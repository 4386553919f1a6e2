/**
 * The whole job in the browser build, in a real Chromium: open the demo study, open a trial, move an
 * onset and see the table mark it edited, undo it, switch the hypothesis set and see the comparison
 * change, exclude a trial, export trials.csv and read it back. Screenshots of each main view go to
 * test-output/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Download } from 'playwright-core';
import { openBrowserBuild, SCREENSHOT_DIR, SKIP_REASON, type BrowserSession } from './browserHarness';

if (SKIP_REASON) console.warn(`skipping end-to-end tests: ${SKIP_REASON}`);

/** A smaller demo than the default one (3 subjects x 12 trials) keeps the run short on a busy machine. */
const DEMO_HASH = '#demo?trials=12';
const TRIAL = 's1-t002';

describe.skipIf(SKIP_REASON !== null)('browser build, end to end', () => {
  let s: BrowserSession;
  const onsetCell = () => s.page.locator(`tr[data-trial-id="${TRIAL}"] td[data-muscle="FCR"]`);
  const readout = () => s.page.locator('[data-testid=onset-readout]');
  const onsetOf = (text: string) => Number(/([\d.]+) s/.exec(text)?.[1]);

  beforeAll(async () => {
    s = await openBrowserBuild();
  }, 240_000);
  afterAll(async () => {
    await s?.close();
  });

  it('opens the demo study: the trial table fills in after the progress bar', async () => {
    await s.page.goto(`${s.url}${DEMO_HASH}`);
    await s.page.waitForSelector('[data-testid=status-evaluation]', { timeout: 180_000 });
    expect(await s.page.locator('table.trials tbody tr').count()).toBe(36);
    await expect.poll(() => onsetCell().textContent()).toMatch(/^\d+\.\d{3}/);
    expect(await s.page.locator('tr[data-trial-id="s1-t007"] .chip-noonset').count()).toBe(1); // the demo's silent trial
    await s.page.screenshot({ path: `${SCREENSHOT_DIR}/1-study-overview.png` });
  }, 240_000);

  it('serves the page under the restrictive CSP with no violation and no page error', async () => {
    const csp = await s.page.evaluate(async () => (await fetch('./index.html')).headers.get('content-security-policy'));
    expect(csp).toContain("script-src 'self'");
    expect(s.console.filter((m) => /Content Security Policy|pageerror|Refused to/i.test(m))).toEqual([]);
  });

  it('opens a trial, moves its onset by 10 ms, and the study table shows the new onset marked edited', async () => {
    const before = (await onsetCell().textContent())!;
    await s.page.click(`tr[data-trial-id="${TRIAL}"] button.link`);
    await s.page.waitForSelector(`[data-plot-id="trial-${TRIAL}"] .main-svg`, { timeout: 60_000 });
    await expect.poll(() => readout().textContent()).toContain(before);
    await s.page.waitForTimeout(300);
    await s.page.screenshot({ path: `${SCREENSHOT_DIR}/2-trial.png`, fullPage: true });
    await s.page.click('button:has-text("+10 ms")');
    await expect.poll(() => readout().textContent()).toContain('(edited)');
    const moved = onsetOf((await readout().textContent())!);
    expect(moved).toBeCloseTo(Number(before) + 0.01, 6);
    await s.page.click('button[role=tab]:has-text("Study")');
    await expect.poll(() => onsetCell().textContent()).toContain(moved.toFixed(3));
    expect(await onsetCell().getAttribute('class')).toContain('edited');
    expect(await s.page.locator(`tr[data-trial-id="${TRIAL}"] .chip-edited`).count()).toBe(1);
  }, 120_000);

  it('drags the onset line in the EMG plot with the mouse', async () => {
    await s.page.click(`tr[data-trial-id="${TRIAL}"] button.link`);
    await s.page.waitForSelector(`[data-plot-id="trial-${TRIAL}"] .main-svg`, { timeout: 60_000 });
    await s.page.waitForTimeout(1000); // let the figure settle (autosize relayouts) before grabbing the line
    const before = onsetOf((await readout().textContent())!);
    // shape 0 is the first muscle's onset line (trialFigure.ts draws the onsets first)
    const box = await s.page.evaluate((id) => {
      const r = document.querySelector(`[data-plot-id="trial-${id}"] path[data-index="0"]`)?.getBoundingClientRect();
      return r ? { x: r.x, y: r.y, width: r.width, height: r.height } : null;
    }, TRIAL);
    expect(box).not.toBeNull();
    const x = box!.x + box!.width / 2;
    const y = box!.y + box!.height / 2;
    await s.page.mouse.move(x, y);
    await s.page.mouse.down();
    await s.page.mouse.move(x + 30, y, { steps: 6 });
    await s.page.mouse.up();
    await expect.poll(async () => onsetOf((await readout().textContent())!)).toBeGreaterThan(before + 0.002);
    await s.page.click('button:has-text("Undo")'); // back to the keyboard-free +10 ms edit
    await expect.poll(async () => onsetOf((await readout().textContent())!)).toBeCloseTo(before, 6);
  }, 120_000);

  it('undo restores the automatic onset and clears the edited mark', async () => {
    await s.page.keyboard.press('Control+z');
    await expect.poll(() => readout().textContent()).not.toContain('(edited)');
    await s.page.click('button[role=tab]:has-text("Study")');
    await expect.poll(async () => (await onsetCell().getAttribute('class')) ?? '').not.toContain('edited');
    expect(await s.page.locator(`tr[data-trial-id="${TRIAL}"] .chip-edited`).count()).toBe(0);
  }, 60_000);

  it('switching the hypothesis set changes the comparison in place', async () => {
    await s.page.click('button[role=tab]:has-text("Hypotheses")');
    await s.page.waitForSelector('[data-plot-id="ttc-at-onset"] .main-svg', { timeout: 60_000 });
    const headers = () => s.page.locator('table.models thead th').allTextContents();
    const posteriors = () => s.page.locator('table.models tbody tr:first-child td .posterior').allTextContents();
    const before = await posteriors();
    const earth = 'Earth gravity (9.80665'; // not "half Earth gravity" nor the Bayesian observer's "Earth-gravity prior"
    expect((await headers()).some((h) => h.includes(earth))).toBe(true);
    await s.page.waitForTimeout(800);
    await s.page.screenshot({ path: `${SCREENSHOT_DIR}/3-hypothesis-comparison.png`, fullPage: true });
    for (const id of ['internal-gravity', 'internal-gravity-profile', 'delay-sensitivity']) {
      const plot = s.page.locator(`[data-plot-id="${id}"]`);
      await plot.scrollIntoViewIfNeeded();
      await expect.poll(() => plot.locator('.main-svg').count()).toBeGreaterThan(0);
      await plot.screenshot({ path: `${SCREENSHOT_DIR}/3-${id}.png` });
    }
    await s.page.uncheck('input[data-hypothesis="gravity"]');
    await expect.poll(async () => (await headers()).some((h) => h.includes(earth))).toBe(false);
    const after = await posteriors();
    expect(after.length).toBe(before.length - 1);
    expect(after).not.toEqual(before.slice(0, after.length));
    const legend = await s.page.locator('ul[aria-label="Hypotheses shown"] li').allTextContents();
    expect(legend.some((t) => t.includes(earth))).toBe(false);
    expect(legend.some((t) => t.includes('half Earth gravity'))).toBe(true);
  }, 120_000);

  it('excludes a trial with a reason', async () => {
    await s.page.click('button[role=tab]:has-text("Study")');
    const row = s.page.locator('tr[data-trial-id="s1-t003"]');
    await row.locator('button:has-text("Exclude…")').click();
    await row.locator('input[aria-label="Reason for excluding"]').fill('ball touched the rail');
    await row.locator('button[type=submit]').click();
    await expect.poll(async () => (await row.getAttribute('class')) ?? '').toContain('excluded');
    expect(await s.page.locator('.counts').textContent()).toContain('1 excluded');
  }, 60_000);

  it('exports trials.csv whose rows reflect the exclusion and the hypothesis set', async () => {
    const downloads: { name: string; path: string }[] = [];
    s.page.on('download', async (d) => downloads.push({ name: d.suggestedFilename(), path: (await d.path())! }));
    await s.page.click('button:has-text("Export tables")');
    await expect.poll(() => downloads.length, { timeout: 60_000 }).toBeGreaterThanOrEqual(3);
    expect(downloads.map((d) => d.name).sort()).toEqual(['methods.txt', 'models.csv', 'trials.csv']);
    const csv = readFileSync(downloads.find((d) => d.name === 'trials.csv')!.path, 'utf8');
    const lines = csv.split(/\r?\n/).filter((l) => l && !l.startsWith('#'));
    const header = lines[0].split(',');
    const rows = lines.slice(1).map((l) => l.split(','));
    const col = (name: string) => header.indexOf(name);
    expect(col('trial')).toBeGreaterThanOrEqual(0);
    expect(col('hypothesis')).toBeGreaterThanOrEqual(0);
    const hyps = new Set(rows.map((r) => r[col('hypothesis')]));
    expect(hyps.has('gravity')).toBe(false);
    expect(hyps.has('constant-velocity')).toBe(true);
    const excludedRows = rows.filter((r) => r[col('trial')] === 's1-t003');
    expect(excludedRows.length).toBeGreaterThan(0);
    expect(excludedRows.every((r) => r[col('excluded')] === 'true' && r[col('usable')] === 'false')).toBe(true);
    expect(csv).toContain('ball touched the rail');
    expect(new Set(rows.map((r) => r[col('trial')])).size).toBe(36);
  }, 120_000);

  // After the tables: headless Chromium holds back a page's automatic downloads once it has made several, as a
  // browser asks its user to allow them.
  it('exports the comparison figure without the switched-off hypothesis', async () => {
    const downloads: { name: string; path: string }[] = [];
    const onDownload = async (d: Download) => downloads.push({ name: d.suggestedFilename(), path: (await d.path())! });
    s.page.on('download', onDownload);
    await s.page.click('button[role=tab]:has-text("Hypotheses")');
    await s.page.waitForSelector('[data-plot-id="ttc-at-onset"] .main-svg', { timeout: 60_000 });
    // switched on and off again while the view is open, Earth gravity's trace stays in the figure, hidden
    const legend = () => s.page.locator('ul[aria-label="Hypotheses shown"] li').allTextContents();
    await s.page.check('input[data-hypothesis="gravity"]');
    await expect.poll(async () => (await legend()).some((t) => t.includes('Earth gravity (9.80665'))).toBe(true);
    await s.page.uncheck('input[data-hypothesis="gravity"]');
    await expect.poll(async () => (await legend()).some((t) => t.includes('Earth gravity (9.80665'))).toBe(false);
    await s.page.click('button:has-text("Export figures")');
    await expect.poll(() => downloads.some((d) => d.name === 'ttc-at-onset.svg'), { timeout: 60_000 }).toBe(true);
    s.page.off('download', onDownload);
    const svg = readFileSync(downloads.find((d) => d.name === 'ttc-at-onset.svg')!.path, 'utf8');
    // on screen the switched-off series stays in the figure, its trace group hidden (steady axes); the file
    // has no trace of it, and plotly's legend lists the others
    const hiddenGroups = await s.page.locator('[data-plot-id="ttc-at-onset"] .scatterlayer .trace').evaluateAll((gs) => gs.filter((g) => getComputedStyle(g).display === 'none').length);
    expect(hiddenGroups).toBe(1);
    const groupsOnScreen = await s.page.locator('[data-plot-id="ttc-at-onset"] .scatterlayer .trace').count();
    expect((svg.match(/class="trace scatter/g) ?? []).length).toBe(groupsOnScreen - 1);
    expect((svg.match(/<path class="point/g) ?? []).length).toBeGreaterThan(0);
    expect(svg).toContain('class="legendtext"');
    expect(svg).toContain('half Earth gravity');
    expect(svg).not.toContain('Earth gravity (9.80665');
  }, 120_000);

  it('shows every view in the dark theme too', async () => {
    await s.page.click('button[aria-label="Switch between light and dark theme"]');
    await s.page.click('button[role=tab]:has-text("Hypotheses")');
    await s.page.waitForSelector('[data-plot-id="ttc-at-onset"] .main-svg');
    await s.page.waitForTimeout(800);
    await s.page.screenshot({ path: `${SCREENSHOT_DIR}/4-hypothesis-comparison-dark.png`, fullPage: true });
    await s.page.click('button[role=tab]:has-text("Trial")');
    await s.page.waitForSelector('[data-plot-id^="trial-"] .main-svg');
    await s.page.waitForTimeout(500);
    await s.page.screenshot({ path: `${SCREENSHOT_DIR}/5-trial-dark.png`, fullPage: true });
    expect(await s.page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
  }, 60_000);

  it('opens a study from its files: the study file with its C3D and EDF+ recordings chosen together', async () => {
    const folder = fileURLToPath(new URL('../../assets/demo/', import.meta.url));
    if (!existsSync(`${folder}study.forecatch.json`)) return; // the CLI's demo files are not in this checkout
    const files = (readdirSync(folder, { recursive: true }) as string[]).filter((f) => /\.(json|c3d|edf)$/.test(f)).map((f) => `${folder}${f}`);
    await s.page.goto(`${s.url}`);
    await s.page.reload();
    const chooser = s.page.waitForEvent('filechooser');
    await s.page.click('button:has-text("Open study…")');
    await (await chooser).setFiles(files);
    await s.page.waitForSelector('[data-testid=status-evaluation]', { timeout: 240_000 });
    expect(await s.page.locator('.study-name').textContent()).toContain('rail lab');
    expect(await s.page.locator('table.trials tbody tr').count()).toBe(72);
    const onsets = await s.page.locator('table.trials td[data-muscle="FCR"]').allTextContents();
    expect(onsets.filter((t) => /^\d+\.\d{3}/.test(t)).length).toBeGreaterThan(60);
    expect(await s.page.locator('.chip-bad').count()).toBe(0);
  }, 300_000);
});
