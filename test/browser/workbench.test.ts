// End-to-end tests of the workbench in Debian's headless chromium (playwright-core), against the
// static build served from a nested path. Screenshots of each view go to test-artifacts/ (not in git).
// What they check comes from the workbench issue: a clean load with no outside request, a moving
// field view, a WebM clip (EBML magic 1A 45 DF A3, the Matroska/WebM spec), CSV exports with the
// CLI's columns and numbers, a refused import that keeps the stack, an edit that survives a reload.

import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Download, Page } from 'playwright-core';
import { buildApp, launch, removeDir, ROOT, serveStatic, type Browser, type StaticSite } from './harness.ts';
import { parseStackText } from '../../src/stack/parse.ts';
import { runReport } from '../../src/report/run.ts';
import { formatEchoesCsv } from '../../src/report/echo-table.ts';
import { formatCsv } from '../../src/report/table.ts';

const ARTIFACTS = join(ROOT, 'test-artifacts');
const VIEWS = ['field-view', 'trace-view', 'spectrum-view', 'profile-view'] as const;

let dist = '';
let site: StaticSite;
let browser: Browser;
let page: Page;
const consoleProblems: string[] = [];
const outside: string[] = [];

interface Stats { fieldRenders: number; renderer: string; step: number; playing: boolean; version: number; solvedVersion: number; reportVersion: number; lastEditToUpdate_ms: number | null }
const stats = (): Promise<Stats> => page.evaluate(() => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats);

async function openPage(): Promise<Page> {
  const p = await browser.context.newPage();
  p.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') consoleProblems.push(`${m.type()}: ${m.text()}`); });
  p.on('pageerror', (e) => consoleProblems.push(`pageerror: ${e.message}`));
  // Any request leaving the page's own origin is recorded (the page's CSP should block it anyway).
  p.on('request', (req) => {
    const u = new URL(req.url());
    if (u.protocol !== 'blob:' && u.protocol !== 'data:' && u.origin !== new URL(site.url).origin) outside.push(u.href);
  });
  await p.goto(site.url);
  await p.waitForFunction(() => (window as unknown as { slabecho?: { stats: Stats } }).slabecho?.stats.solvedVersion === 0, undefined, { timeout: 30_000 });
  return p;
}

async function downloadsOf(action: () => Promise<void>, count: number, timeout_ms = 30_000): Promise<Download[]> {
  const got: Download[] = [];
  const listener = (d: Download): void => { got.push(d); };
  page.on('download', listener);
  await action();
  const t0 = Date.now();
  while (got.length < count && Date.now() - t0 < timeout_ms) await page.waitForTimeout(100);
  page.off('download', listener);
  return got;
}

/** Two CSV texts agree: same header and row count, text cells equal, numbers equal to `tol` (relative, or absolute below 1). */
function sameCsv(name: string, got: string, want: string, tol = 1e-9): void {
  const g = got.trimEnd().split('\n'), w = want.trimEnd().split('\n');
  expect(g[0], `${name} header`).toBe(w[0]);
  expect(g.length, `${name} rows`).toBe(w.length);
  for (let i = 1; i < w.length; i++) {
    const a = g[i].split(','), b = w[i].split(',');
    expect(a.length, `${name} row ${i}`).toBe(b.length);
    for (let j = 0; j < b.length; j++) {
      const x = Number(a[j]), y = Number(b[j]);
      if (Number.isNaN(y)) expect(a[j], `${name} row ${i} col ${j}`).toBe(b[j]);
      else if (!(Math.abs(x - y) <= tol * Math.max(1, Math.abs(y)))) expect(x, `${name} row ${i} col ${j}`).toBe(y);
    }
  }
}

async function saved(d: Download): Promise<Buffer> {
  const path = join(ARTIFACTS, 'downloads', d.suggestedFilename());
  await d.saveAs(path);
  return readFileSync(path);
}

describe('workbench in headless chromium', { timeout: 180_000 }, () => {
  beforeAll(async () => {
    mkdirSync(join(ARTIFACTS, 'downloads'), { recursive: true });
    dist = await buildApp();
    site = await serveStatic(dist);
    browser = await launch();
    page = await openPage();
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    await site?.close();
    if (dist) removeDir(dist);
  });

  it('loads from a nested path with the canvas renderer, no console errors, no 404 and nothing outside its origin', async () => {
    await page.waitForTimeout(1500);
    const s = await stats();
    expect(s.renderer).toBe('canvas');
    expect(await page.title()).toContain('slabecho');
    const csp = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(csp).toContain("default-src 'self'");
    for (const id of VIEWS) await expect(page.locator(`[data-testid="${id}"] canvas`).count()).resolves.toBe(1);
    expect(site.log.filter((r) => r.status >= 400)).toEqual([]);
    expect(site.log.some((r) => r.path.endsWith('/favicon.svg') && r.status === 200)).toBe(true);
    expect(outside).toEqual([]);
    expect(consoleProblems).toEqual([]);
    // The about panel carries the cautions.
    await page.click('[data-testid="about-open"]');
    await expect(page.locator('[data-testid="about"]').textContent()).resolves.toMatch(/licensed professional practice/);
    await page.click('[data-testid="about-close"]');
    expect(await page.locator('[data-testid="about"]').isVisible()).toBe(false);
  });

  it('animates the field view while playing (pixels differ between two moments)', async () => {
    const pixels = (): Promise<string> => page.locator('[data-testid="field-view"] canvas').evaluate((c) => (c as HTMLCanvasElement).toDataURL());
    const before = await pixels();
    const s0 = await stats();
    await page.keyboard.press('Space');
    await page.waitForFunction((n) => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats.step > n + 200, s0.step);
    const s1 = await stats();
    expect(s1.playing).toBe(true);
    const during = await pixels();
    await page.waitForTimeout(300);
    const later = await pixels();
    expect(during).not.toBe(before);
    expect(later).not.toBe(during);
    await page.keyboard.press('Space');
    const paused = await stats();
    expect(paused.playing).toBe(false);
    await page.keyboard.press('ArrowRight');
    await page.waitForFunction((n) => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats.step > n, paused.step);
  });

  it('records a WebM clip of the field view', async () => {
    await page.click('[data-testid="reset"]');
    const [clip] = await downloadsOf(async () => {
      await page.click('[data-testid="record"]');
      await page.waitForTimeout(2500);
      await page.click('[data-testid="record"]');
    }, 1);
    expect(clip).toBeDefined();
    const title = await page.locator('[data-testid="stack-title"]').textContent();
    expect(clip.suggestedFilename()).toBe(`${title}.webm`);
    const bytes = await saved(clip);
    // EBML header magic of Matroska/WebM files.
    expect([...bytes.subarray(0, 4)]).toEqual([0x1a, 0x45, 0xdf, 0xa3]);
    expect(bytes.length).toBeGreaterThan(5_000);
    expect(bytes.length).toBeLessThan(50_000_000);
  });

  it('exports the CLI\'s tables (same columns, same numbers), the stack file, the summary and a PNG per view', async () => {
    await page.waitForFunction(() => ['done', 'failed'].includes(document.querySelector<HTMLElement>('[data-testid="run-status"]')?.dataset.state ?? ''), undefined, { timeout: 150_000 });
    await expect(page.locator('[data-testid="run-status"]').getAttribute('data-state')).resolves.toBe('done');
    // The page says how far the three methods agree, with the targets (the figures come from the report).
    const agreement = await page.locator('[data-testid="agreement"]').textContent();
    expect(agreement).toMatch(/FEM vs exact.*met/s);
    expect(agreement).toMatch(/FDTD vs exact/);
    const files = await downloadsOf(() => page.click('[data-testid="export"]'), 11);
    const byName = new Map<string, Buffer>();
    for (const d of files) byName.set(d.suggestedFilename(), await saved(d));
    expect([...byName.keys()].sort()).toEqual(expect.arrayContaining(
      ['spectrum.csv', 'profile.csv', 'echoes.csv', 'echoes_T.csv', 'trace.csv', 'summary.json', ...VIEWS.map((v) => `${v}.png`)]));
    const text = (n: string): string => { const b = byName.get(n); expect(b, n).toBeDefined(); return b!.toString('utf8'); };
    const header = (n: string): string => text(n).split('\n')[0];
    expect(header('spectrum.csv')).toMatch(/^f_GHz,R_tmm_re,R_tmm_im,T_tmm_re,T_tmm_im/);
    expect(header('spectrum.csv')).toContain('R_fdtd_re,R_fdtd_im,T_fdtd_re,T_fdtd_im');
    expect(header('profile.csv')).toMatch(/^x_mm,E_tmm_re,E_tmm_im/);
    expect(header('profile.csv')).toContain('E_fdtd_re,E_fdtd_im');
    expect(header('echoes.csv')).toBe('t_ns,level_dB,amplitude,predicted_t_ns,path,nearest_path,resolved');
    expect(header('echoes_T.csv')).toBe(header('echoes.csv'));
    expect(header('trace.csv')).toBe('t_ns,E_incident,E_reflected,E_transmitted');
    expect(JSON.parse(text('summary.json'))).toHaveProperty('grid');
    // The exported stack file runs unchanged through the pipeline `slabecho run` uses and gives the
    // same tables: same header, same rows, same paths, numbers equal to 1e-9 (relative above 1). The
    // browser's and node's JavaScript engines may differ in the last bits of a few Math functions;
    // echo delays and levels come from iterated peak searches, so they are held to 1e-6.
    const stackName = [...byName.keys()].find((n) => n.endsWith('.stack.json'));
    expect(stackName).toBeDefined();
    const parsed = parseStackText(text(stackName!));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const cli = await runReport(parsed.stack, { inputWarnings: parsed.warnings });
    const expected: Record<string, string> = {
      'spectrum.csv': formatCsv(cli.spectrum),
      'profile.csv': formatCsv(cli.profile),
      'echoes.csv': formatEchoesCsv(cli.echoes),
      'echoes_T.csv': formatEchoesCsv(cli.echoesT),
      'trace.csv': formatCsv(cli.trace),
    };
    for (const [name, want] of Object.entries(expected)) sameCsv(name, text(name), want, name.startsWith('echoes') ? 1e-6 : 1e-9);
    for (const v of VIEWS) {
      const png = byName.get(`${v}.png`);
      expect(png, `${v}.png`).toBeDefined();
      expect([...png!.subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
    }
    for (const v of VIEWS) await page.locator(`[data-testid="${v}"]`).screenshot({ path: join(ARTIFACTS, `${v}.png`) });
    await page.screenshot({ path: join(ARTIFACTS, 'workbench.png'), fullPage: true });
  });

  it('switches the spectrum to phase and group delay and the echoes to a dB envelope (each redraws the chart)', async () => {
    const pixels = (id: string): Promise<string> => page.locator(`[data-testid="${id}"] canvas`).evaluate((c) => (c as HTMLCanvasElement).toDataURL());
    const seen = new Set([await pixels('spectrum-view')]);
    for (const mode of ['phase', 'group delay', 'magnitude']) {
      await page.locator('[data-testid="spectrum-mode"] select').selectOption(mode);
      await expect.poll(() => pixels('spectrum-view')).not.toBe([...seen].at(-1));
      seen.add(await pixels('spectrum-view'));
      await page.locator('[data-testid="spectrum-view"]').screenshot({ path: join(ARTIFACTS, `spectrum-view-${mode.replace(' ', '-')}.png`) });
    }
    expect(seen.size).toBe(3); // magnitude, phase, group delay (the last switch comes back to the first picture)
    const plain = await pixels('trace-view');
    await page.locator('[data-testid="envelope"] input').check();
    await expect.poll(() => pixels('trace-view')).not.toBe(plain);
    await page.locator('[data-testid="trace-view"]').screenshot({ path: join(ARTIFACTS, 'trace-view-envelope.png') });
    await page.locator('[data-testid="envelope"] input').uncheck();
    await expect.poll(() => pixels('trace-view')).toBe(plain);
  });

  it('refuses a bad import with the parser’s field-named message and keeps the stack', async () => {
    const titleBefore = await page.locator('[data-testid="stack-title"]').textContent();
    const versionBefore = (await stats()).version;
    const bad = JSON.stringify({ title: 'Bad one', band_GHz: [1, 6], layers: [{ material: 'brick', thickness_mm: -3 }] });
    const path = join(ARTIFACTS, 'downloads', 'bad.stack.json');
    writeFileSync(path, bad);
    await page.setInputFiles('[data-testid="import"]', path);
    const msg = page.locator('[data-testid="msg-import"]');
    await msg.waitFor();
    await expect(msg.textContent()).resolves.toContain('layers[0].thickness_mm');
    await expect(page.locator('[data-testid="stack-title"]').textContent()).resolves.toBe(titleBefore);
    expect((await stats()).version).toBe(versionBefore);
    // Not JSON at all.
    writeFileSync(path, '{ "band_GHz": [1, 6], ');
    await page.setInputFiles('[data-testid="import"]', path);
    await page.waitForFunction(() => document.querySelector('[data-testid="msg-import"]')?.textContent?.includes('file:') === true);
    await expect(page.locator('[data-testid="stack-title"]').textContent()).resolves.toBe(titleBefore);
  });

  it('edits the stack: adds, reorders and removes layers, and the exact/FEM views follow', async () => {
    const layerCount = (): Promise<number> => page.locator('[data-testid$="-material"][data-testid^="layer-"]').count();
    const n0 = await layerCount();
    const v0 = (await stats()).version;
    await page.click('[data-testid="layer-add"] button');
    await expect.poll(layerCount).toBe(n0 + 1);
    await page.locator(`[data-testid="layer-${n0}-material"] select`).selectOption('concrete');
    await page.click(`[data-testid="layer-${n0}-up"] button`);
    await expect.poll(() => page.locator(`[data-testid="layer-${n0 - 1}-material"] select`).inputValue()).toBe('concrete');
    await page.waitForFunction((v) => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.version >= v + 3 && s.solvedVersion === s.version;
    }, v0);
    await page.click(`[data-testid="layer-${n0 - 1}-remove"] button`);
    await expect.poll(layerCount).toBe(n0);
    await expect.poll(() => page.locator(`[data-testid="layer-${n0 - 1}-material"] select`).inputValue()).not.toBe('concrete');
    // A negative thickness is refused with the field named (not clamped to some small value and applied).
    const thickness = page.locator('[data-testid="layer-0-thickness"] input');
    const before = await thickness.inputValue();
    const v1 = (await stats()).version;
    await thickness.fill('-4');
    await thickness.press('Enter');
    await expect.poll(() => page.locator('[data-testid="msg-edit"]').textContent()).toContain('layers[0].thickness_mm');
    expect((await stats()).version).toBe(v1);
    await expect(thickness.inputValue()).resolves.toBe(before);
  });

  it('cancels the background pulse run and starts it again', async () => {
    const state = (): Promise<string | null> => page.locator('[data-testid="run-status"]').getAttribute('data-state');
    await page.locator('[data-testid="preset"] select').selectOption('meeting-room-partition');
    await page.click('[data-testid="run-cancel"]');
    expect(await state()).toBe('cancelled');
    await page.waitForTimeout(1000);
    expect(await state()).toBe('cancelled');
    await page.click('[data-testid="run-start"]');
    await page.waitForSelector('[data-testid="run-status"][data-state="done"]', { timeout: 120_000 });
  });

  it('runs oblique TE in the pulse engine and says once, in words, why TM at an angle has no pulse run', async () => {
    const state = (): Promise<string | null> => page.locator('[data-testid="run-status"]').getAttribute('data-state');
    await page.locator('[data-testid="preset"] select').selectOption('radome-panel');
    await page.waitForSelector('[data-testid="run-status"][data-state="done"]', { timeout: 120_000 });
    await expect(page.locator('[data-testid="agreement"]').textContent()).resolves.toMatch(/FDTD vs exact/);
    expect(await page.locator('[data-testid="msg-pulse"]').count()).toBe(0);
    await page.evaluate(() => window.scrollTo(0, 0)); // keep the sticky top bar off the screenshots
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-oblique-TE.png') });
    await page.locator('[data-testid="polarization"] select').selectOption('TM');
    const refusal = page.locator('[data-testid="msg-pulse"]');
    await refusal.waitFor();
    await expect(refusal.textContent()).resolves.toContain('incidence.polarization');
    await expect.poll(state).toBe('done');
    // The refusal is not repeated among the warnings, and no FDTD row or echo is claimed.
    // (With no other warning for this stack there may be no warnings box at all.)
    expect(await page.locator('[data-testid="msg-warnings"]', { hasText: 'FDTD skipped' }).count()).toBe(0);
    const agreement = await page.locator('[data-testid="agreement"]').textContent();
    expect(agreement).toMatch(/FEM vs exact/);
    expect(agreement).not.toMatch(/FDTD/);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-oblique-TM.png') });
    await page.locator('[data-testid="trace-view"]').screenshot({ path: join(ARTIFACTS, 'trace-view-oblique-TM.png') });
    await page.locator('[data-testid="profile-view"]').screenshot({ path: join(ARTIFACTS, 'profile-view-oblique-TM.png') });
  });

  it('keeps an edit across a reload', async () => {
    const input = page.locator('[data-testid="layer-0-thickness"] input');
    await input.fill('123.5');
    await input.press('Enter');
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.solvedVersion === s.version && s.version > 0;
    });
    expect((await stats()).lastEditToUpdate_ms).not.toBeNull();
    await page.reload();
    await page.waitForFunction(() => (window as unknown as { slabecho?: { stats: Stats } }).slabecho?.stats.solvedVersion === 0);
    await expect(page.locator('[data-testid="layer-0-thickness"] input').inputValue()).resolves.toBe('123.5');
    await expect(page.locator('[data-testid="layer-0"] .lil-title').first().textContent()).resolves.toContain('123.5 mm');
    expect(consoleProblems).toEqual([]);
    expect(outside).toEqual([]);
  });
});
