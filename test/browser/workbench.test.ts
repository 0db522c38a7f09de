// End-to-end tests of the workbench in Debian's headless chromium (playwright-core), against the
// static build served from a nested path. Screenshots of each view go to test-artifacts/ (not in git).
// What they check comes from the workbench issues: a clean load with no outside request, a moving
// field view framed around the stack, zoom, clips whose containers carry their duration (read back
// with mediabunny's demuxer; WebM's EBML magic 1A 45 DF A3 from the Matroska spec, MP4's "ftyp" box
// from ISO/IEC 14496-12) and that start as the pulse reaches the stack, one zip export (read back with
// fflate) whose CSVs equal the CLI's, chart readouts equal to the exact solver run in node, refused
// input named by field, the preset menu's name after an import and a reload, the layout at 1024 px.

import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Download, Page } from 'playwright-core';
import { unzipSync } from 'fflate';
import { ALL_FORMATS, BufferSource, Input } from 'mediabunny';
import { buildApp, launch, removeDir, ROOT, serveStatic, type Browser, type StaticSite } from './harness.ts';
import { parseStackObject, parseStackText } from '../../src/stack/parse.ts';
import { runReport, type RunReport } from '../../src/report/run.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { formatEchoesCsv } from '../../src/report/echo-table.ts';
import { findColumn, formatCsv } from '../../src/report/table.ts';
import { solveTmm } from '../../src/tmm/solve.ts';
import { stackThickness_m } from '../../src/stack/types.ts';
import type { WorkbenchProbe, WorkbenchStats } from '../../src/app/stats.ts';
import { cli, readCsv, tempDir } from '../cli/support.ts';

const ARTIFACTS = join(ROOT, 'test-artifacts');
const VIEWS = ['field-view', 'trace-view', 'spectrum-view', 'profile-view', 'spacetime-view'] as const;

let dist = '';
let site: StaticSite;
let browser: Browser;
let page: Page;
const consoleProblems: string[] = [];
const outside: string[] = [];

type Stats = WorkbenchStats;
const stats = (): Promise<Stats> => page.evaluate(() => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats);
type Probe = WorkbenchProbe;
/** Call the page's probe (chart and field-view geometry) with JSON-able arguments. */
const probe = <K extends keyof Probe>(name: K, ...args: Parameters<Probe[K]>): Promise<ReturnType<Probe[K]>> =>
  page.evaluate(([n, a]) => {
    const p = (window as unknown as { slabecho: { probe: Record<string, (...x: unknown[]) => unknown> } }).slabecho.probe;
    return p[n as string](...(a as unknown[]));
  }, [name, args] as const) as Promise<ReturnType<Probe[K]>>;
const C0 = 299_792_458;
/** The engine's pulse envelope exp(−(t/τ)²) has its band edges 12 dB down: τ = √(12 ln 10 / 20) / (π Δf/2) (Gaussian spectrum, closed form). */
const tauOfBand = (f1_GHz: number, f2_GHz: number): number => Math.sqrt((12 * Math.LN10) / 20) / (Math.PI * ((f2_GHz - f1_GHz) / 2) * 1e9);
const DEFAULT_PRESET = JSON.parse(readFileSync(join(ROOT, 'presets', 'default.stack.json'), 'utf8')) as { title: string; band_GHz: [number, number] };
/** The default preset's file name stem: its title with spaces as hyphens (the workbench's rule). */
const DEFAULT_STEM = DEFAULT_PRESET.title.replace(/ /g, '-');

/** runReport of a stack file's text, once per text (the CLI's pipeline, in node). */
const reports = new Map<string, Promise<RunReport>>();
function nodeReport(text: string): Promise<RunReport> {
  let r = reports.get(text);
  if (r === undefined) {
    const parsed = parseStackText(text);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    r = runReport(parsed.stack, { inputWarnings: parsed.warnings });
    reports.set(text, r);
  }
  return r;
}

async function choosePreset(name: string): Promise<void> {
  await page.locator('[data-testid="preset"] select').selectOption(name);
  await page.waitForFunction(() => {
    const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
    return s.solvedVersion === s.version && s.field.grid;
  });
}

const presetShown = (): Promise<string> => page.locator('[data-testid="preset"] select').evaluate((el) => {
  const s = el as HTMLSelectElement;
  return s.options[s.selectedIndex]?.text ?? '';
});

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
    // The engine worker fetched the WebAssembly time step from the page's own origin and steps with it.
    expect(csp).toContain("'wasm-unsafe-eval'");
    await page.waitForFunction(() => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats.engine !== '');
    expect((await stats()).engine).toBe('wasm-simd');
    expect(site.log.some((r) => r.path.endsWith('.wasm') && r.status === 200)).toBe(true);
    // One picture canvas per view (the charts' cursor overlay is a second, empty canvas).
    for (const id of VIEWS) await expect(page.locator(`[data-testid="${id}"] canvas:not(.chart-overlay)`).count()).resolves.toBe(1);
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

  it('records clips frame by frame (WebM/VP9 and MP4/H.264) that carry their duration and start as the pulse reaches the front face', async () => {
    const length = page.locator('[data-testid="clip-length"] input').last();
    await length.fill('2');
    await length.press('Enter');
    const fileText = JSON.stringify(DEFAULT_PRESET);
    for (const [format, ext] of [['WebM (VP9)', 'webm'], ['MP4 (H.264)', 'mp4']] as const) {
      await page.locator('[data-testid="clip-format"] select').selectOption(format);
      const [clip] = await downloadsOf(() => page.click('[data-testid="record"]'), 1, 90_000);
      expect(clip, format).toBeDefined();
      expect(clip.suggestedFilename()).toBe(`${DEFAULT_STEM}.${ext}`);
      const bytes = await saved(clip);
      if (ext === 'webm') expect([...bytes.subarray(0, 4)]).toEqual([0x1a, 0x45, 0xdf, 0xa3]);
      else expect(bytes.subarray(4, 8).toString('latin1')).toBe('ftyp');
      // The container's own duration (what players show), read by an independent demuxer.
      const input = new Input({ source: new BufferSource(bytes), formats: ALL_FORMATS });
      const meta = await input.getDurationFromMetadata();
      const s = await stats();
      const c = s.lastClip!;
      expect(c.frames).toBeGreaterThan(30);
      expect(meta).not.toBeNull();
      expect(meta!).toBeGreaterThan(0);
      expect(Math.abs(meta! - c.frames / c.fps)).toBeLessThanOrEqual(1.5 / c.fps);
      expect(Math.abs(c.duration_s - 2)).toBeLessThanOrEqual(0.2);
      expect(await input.getMimeType()).toMatch(ext === 'webm' ? /vp09|vp8/ : /avc1/);
      input.dispose();
    }
    // The clip starts within one pulse width before the incident pulse reaches the front face. The arrival is
    // the energy centroid of the incident record at x = 0 of a run on the field view's grid, computed in node
    // (for a pulse with a symmetric envelope the centroid is the envelope's peak; the view's grid has a longer
    // front gap than `slabecho run`'s, so its pulse arrives later); the width is the envelope's FWHM, 2τ√ln 2.
    const parsed = parseStackText(fileText);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    const viewRun = runToEndSync(createPulseRun(parsed.stack, { forView: true }));
    const rec = viewRun.records(), inc = rec.incident;
    let m0 = 0, m1 = 0;
    for (let i = 0; i < rec.count; i++) { m0 += inc[i] * inc[i]; m1 += i * rec.dt_s * 1e9 * inc[i] * inc[i]; }
    const arrival_ns = m1 / m0;
    const fwhm_ns = 2 * tauOfBand(...DEFAULT_PRESET.band_GHz) * Math.sqrt(Math.LN2) * 1e9;
    const c = (await stats()).lastClip!;
    expect(c.start_ns).toBeLessThanOrEqual(arrival_ns);
    expect(c.start_ns).toBeGreaterThanOrEqual(arrival_ns - fwhm_ns);
    expect(c.end_ns).toBeGreaterThan(arrival_ns + fwhm_ns);
    await expect(page.locator('[data-testid="msg-record"]').textContent()).resolves.toMatch(/Clip saved/);
  });

  it('exports one zip named from the title and the date, holding the CLI\'s tables (same columns, same numbers), the summary, the stack file, a PNG per view and the clip', async () => {
    await page.waitForFunction(() => ['done', 'failed'].includes(document.querySelector<HTMLElement>('[data-testid="run-status"]')?.dataset.state ?? ''), undefined, { timeout: 150_000 });
    await expect(page.locator('[data-testid="run-status"]').getAttribute('data-state')).resolves.toBe('done');
    // The page says how far the three methods agree, with the targets (the figures come from the report).
    const agreement = await page.locator('[data-testid="agreement"]').textContent();
    expect(agreement).toMatch(/FEM vs exact.*met/s);
    expect(agreement).toMatch(/FDTD vs exact/);
    const day = (d: Date): string => `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
    const before = day(new Date());
    const files = await downloadsOf(() => page.click('[data-testid="export"]'), 2, 3_000); // a second download would be a fault
    expect(files).toHaveLength(1);
    const zipName = files[0].suggestedFilename();
    expect([`${DEFAULT_STEM}-${before}.zip`, `${DEFAULT_STEM}-${day(new Date())}.zip`]).toContain(zipName);
    const folder = zipName.replace(/\.zip$/, '');
    const unzipped = unzipSync(new Uint8Array(await saved(files[0])));
    const byName = new Map<string, Buffer>();
    for (const [path, data] of Object.entries(unzipped)) {
      expect(path.startsWith(`${folder}/`), path).toBe(true);
      byName.set(path.slice(folder.length + 1), Buffer.from(data));
    }
    expect([...byName.keys()].sort()).toEqual([
      'README.txt', `${DEFAULT_STEM}.mp4`, `${DEFAULT_STEM}.stack.json`, 'echoes.csv', 'echoes_T.csv', ...VIEWS.map((v) => `${v}.png`),
      'profile.csv', 'spectrum.csv', 'summary.json', 'trace.csv', 'spacetime.csv',
    ].sort());
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
    // spacetime.csv: t_ns,x_mm,E on the grid the README states, times and positions in order, finite values.
    const grid = /spacetime\.csv: .* on (\d+) times .* × (\d+) positions/.exec(text('README.txt'));
    expect(grid).not.toBeNull();
    const st = text('spacetime.csv').trimEnd().split('\n');
    expect(st[0]).toBe('t_ns,x_mm,E');
    const [times, positions] = [Number(grid![1]), Number(grid![2])];
    expect(st.length - 1).toBe(times * positions);
    const cells = st.slice(1).map((l) => l.split(',').map(Number));
    expect(cells.every((c) => c.length === 3 && c.every(Number.isFinite))).toBe(true);
    expect(cells[positions][0]).toBeGreaterThan(cells[0][0]);
    expect(cells[1][1]).toBeGreaterThan(cells[0][1]);
    expect(Math.max(...cells.map((c) => Math.abs(c[2])))).toBeGreaterThan(0.3); // the incident pulse is in it (peak 1)
    // The exported stack file runs unchanged through the pipeline `slabecho run` uses and gives the
    // same tables: same header, same rows, same paths, numbers equal to 1e-9 (relative above 1). The
    // browser's and node's JavaScript engines may differ in the last bits of a few Math functions;
    // echo delays and levels come from iterated peak searches, so they are held to 1e-6.
    const stackText = text(`${DEFAULT_STEM}.stack.json`);
    expect(parseStackText(stackText).ok).toBe(true);
    const cli = await nodeReport(stackText);
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
    expect(byName.get(`${DEFAULT_STEM}.mp4`)!.subarray(4, 8).toString('latin1')).toBe('ftyp');
    expect(text('README.txt')).toMatch(/licensed professional practice/);
    for (const v of VIEWS) await page.locator(`[data-testid="${v}"]`).screenshot({ path: join(ARTIFACTS, `${v}.png`) });
    await page.screenshot({ path: join(ARTIFACTS, 'workbench.png'), fullPage: true });
  });

  it('maps the pulse run in space and time, with each echo row\'s ray returning to the front face at the echo table\'s delay', async () => {
    // A lossless slab: echo k comes back after k round trips of 2 d √ε / c (the multiple-reflection series,
    // Born & Wolf §1.6), and node's runReport of the same file gives the echo table the rays must meet.
    const d_mm = 100, slab = { title: 'Ceramic slab for the space-time check', band_GHz: [1, 6], points: 101, layers: [{ material: 'tile', thickness_mm: d_mm }], materials: { tile: { model: 'fixed', eps_r: 4 } } };
    const path = join(ARTIFACTS, 'downloads', 'spacetime-slab.stack.json');
    writeFileSync(path, JSON.stringify(slab));
    await page.setInputFiles('[data-testid="import"]', path);
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.reportVersion === s.version && document.querySelector('[data-testid="stack-title"]')?.textContent?.startsWith('Ceramic') === true;
    }, undefined, { timeout: 120_000 });
    await expect.poll(async () => (await probe('spacetime'))?.rays.length ?? 0).toBeGreaterThan(3);
    const map = (await probe('spacetime'))!;
    expect(map.rows).toBeGreaterThan(50);
    expect(map.columns).toBeGreaterThan(50);
    expect(map.x_mm[0]).toBeLessThan(0);
    expect(map.x_mm[1]).toBeGreaterThan(d_mm);
    const rep = await nodeReport(JSON.stringify(slab));
    const summary = rep.summary as { echoes: { delay_zero_ns: number; t_ns: number[] } };
    const t0 = summary.echoes.delay_zero_ns, delays = summary.echoes.t_ns;
    expect(delays.length).toBeGreaterThanOrEqual(3);
    const roundTrip_ns = (2 * d_mm * 1e-3 * 2) / C0 * 1e9;
    delays.forEach((t, i) => {
      const ray = map.rays.find((r) => r.label === String(i + 1));
      expect(ray, `ray ${i + 1}`).toBeDefined();
      // Where the ray meets x = 0 on its way out (the last vertex at the front face).
      const k = ray!.x_mm.map((x) => Math.abs(x) < 1e-9).lastIndexOf(true);
      const exit = ray!.t_ns[k];
      expect(Math.abs(exit - (t0 + t))).toBeLessThan(2e-3); // the echo table's delay (ns, 6 digits in summary.json)
      expect(Math.abs(exit - t0 - i * roundTrip_ns)).toBeLessThan(2e-3); // the series
      expect(Math.max(...ray!.x_mm.slice(0, k + 1))).toBeCloseTo(i === 0 ? 0 : d_mm, 9);
    });
    const t1 = map.rays.find((r) => r.label === 'T1');
    expect(t1).toBeDefined();
    expect(t1!.t_ns[1] - t1!.t_ns[0]).toBeCloseTo(roundTrip_ns / 2, 4);
    // The picture holds the field: strongly coloured pixels along the incident ray, pale ones far from any ray.
    const colourful = await page.locator('[data-testid="spacetime-view"] canvas').evaluate((c) => {
      const cv = c as HTMLCanvasElement, ctx = cv.getContext('2d')!;
      const px = ctx.getImageData(0, 0, cv.width, cv.height).data;
      let strong = 0;
      for (let i = 0; i < px.length; i += 4) if (Math.max(px[i], px[i + 1], px[i + 2]) - Math.min(px[i], px[i + 1], px[i + 2]) > 80) strong++;
      return strong / (cv.width * cv.height);
    });
    expect(colourful).toBeGreaterThan(0.01);
    await page.locator('[data-testid="spacetime-view"]').screenshot({ path: join(ARTIFACTS, 'spacetime-view-slab.png') });
    await choosePreset('default');
    await page.waitForSelector('[data-testid="run-status"][data-state="done"]', { timeout: 120_000 }); // the readout test reads the FDTD curve
  });

  it('switches the spectrum to phase and group delay and the echoes to a dB envelope (each redraws the chart)', async () => {
    const pixels = (id: string): Promise<string> => page.locator(`[data-testid="${id}"] canvas.chart-canvas`).evaluate((c) => (c as HTMLCanvasElement).toDataURL());
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

  it('reads every series off the spectrum at the cursor (the exact solver in node gives the same values at 5.2 GHz), zooms to a dragged box and back, and switches to a log frequency axis and linear magnitudes', async () => {
    const rows = async (): Promise<{ head: string; rows: Array<{ group: string; label: string; value: string }> }> =>
      page.locator('[data-testid="spectrum-view-readout"]').evaluate((el) => {
        let group = '';
        const out: Array<{ group: string; label: string; value: string }> = [];
        for (const c of Array.from(el.children)) {
          if (c.classList.contains('readout-group')) group = c.textContent ?? '';
          if (c.classList.contains('readout-row')) out.push({ group, label: c.querySelector('.readout-label')?.textContent ?? '', value: c.querySelector('.readout-value')?.textContent ?? '' });
        }
        return { head: el.querySelector('.readout-head')?.textContent ?? '', rows: out };
      });
    const hover = async (f_GHz: number, panel = 0): Promise<void> => {
      await page.locator('[data-testid="spectrum-view"]').scrollIntoViewIfNeeded(); // the views column is taller than the window
      const pt = await probe('chartPoint', 'spectrum-view', f_GHz, panel);
      expect(pt).not.toBeNull();
      await page.mouse.move(pt!.x, pt!.y);
      await expect.poll(async () => (await rows()).head).toContain('f = ');
    };
    const num = (v: string): number => Number(v.replace('−', '-').replace(/\s*dB$/, ''));
    // The exact solution in node, at the frequency under the cursor.
    const parsed = parseStackObject(DEFAULT_PRESET);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    const exact = solveTmm(parsed.stack, Float64Array.of(5.2e9));
    const dB = (re: number, im: number): number => 20 * Math.log10(Math.hypot(re, im));
    await hover(5.2);
    let r = await rows();
    expect(r.head).toBe('f = 5.2 GHz');
    const value = (group: RegExp, label: string): string => {
      const row = r.rows.find((x) => group.test(x.group) && x.label === label);
      expect(row, `${group} ${label}`).toBeDefined();
      return row!.value;
    };
    // Shown to 3 decimals in dB: equal to the exact value to half a unit in the last place.
    expect(Math.abs(num(value(/^\|R\|/, 'exact (TMM)')) - dB(exact.R_re[0], exact.R_im[0]))).toBeLessThanOrEqual(0.0005 + 1e-12);
    expect(Math.abs(num(value(/^\|T\|/, 'exact (TMM)')) - dB(exact.T_re[0], exact.T_im[0]))).toBeLessThanOrEqual(0.0005 + 1e-12);
    // Every series is read out: the FEM (within its 1e-5 target, so to the shown decimals) and the FDTD run.
    expect(Math.abs(num(value(/^\|R\|/, 'FEM')) - dB(exact.R_re[0], exact.R_im[0]))).toBeLessThanOrEqual(0.0015);
    expect(Number.isFinite(num(value(/^\|R\|/, 'FDTD')))).toBe(true);
    expect(r.rows.some((x) => /difference/.test(x.group))).toBe(true);
    await page.locator('[data-testid="spectrum-view"]').screenshot({ path: join(ARTIFACTS, 'spectrum-view-readout.png') });

    // Box zoom: drag across 2–3 GHz in the |R| panel (a flat box, so only x zooms), then reset.
    const a = (await probe('chartPoint', 'spectrum-view', 2, 0))!, b = (await probe('chartPoint', 'spectrum-view', 3, 0))!;
    await page.mouse.move(a.x, a.y);
    await page.mouse.down();
    await page.mouse.move(b.x, b.y + 2, { steps: 4 });
    await page.mouse.up();
    await expect.poll(() => probe('chartRange', 'spectrum-view')).not.toEqual([1, 6]);
    const zoomed = (await probe('chartRange', 'spectrum-view'))!;
    const pxPerGHz = (b.x - a.x) / 1;
    expect(Math.abs(zoomed[0] - 2) * pxPerGHz).toBeLessThanOrEqual(1.01);
    expect(Math.abs(zoomed[1] - 3) * pxPerGHz).toBeLessThanOrEqual(1.01);
    await page.click('[data-testid="spectrum-view-zoom-reset"]');
    await expect.poll(() => probe('chartRange', 'spectrum-view')).toEqual([1, 6]);

    // Log frequency: 2 GHz sits at log(2)/log(6) of the way from 1 to 6 GHz (linear: at 1/5).
    const share = async (): Promise<number> => {
      const [p1, p2, p6] = await Promise.all([1, 2, 6].map((f) => probe('chartPoint', 'spectrum-view', f, 0)));
      return (p2!.x - p1!.x) / (p6!.x - p1!.x);
    };
    expect(await share()).toBeCloseTo(0.2, 6);
    await page.locator('[data-testid="freq-scale"] select').selectOption('log');
    await expect.poll(share).toBeCloseTo(Math.log(2) / Math.log(6), 6);
    await page.locator('[data-testid="spectrum-view"]').screenshot({ path: join(ARTIFACTS, 'spectrum-view-log.png') });
    await page.locator('[data-testid="freq-scale"] select').selectOption('linear');
    await expect.poll(share).toBeCloseTo(0.2, 6);

    // Linear magnitudes: |R| itself, 5 significant digits.
    await page.locator('[data-testid="magnitude-scale"] select').selectOption('linear');
    await page.mouse.move(0, 0);
    await hover(5.2);
    await expect.poll(async () => (await rows()).rows[0]?.group ?? '').toBe('|R|');
    r = await rows();
    const lin = Math.hypot(exact.R_re[0], exact.R_im[0]);
    expect(Math.abs(num(value(/^\|R\|$/, 'exact (TMM)')) - lin)).toBeLessThanOrEqual(5e-5 * lin + 1e-12);
    await page.locator('[data-testid="magnitude-scale"] select').selectOption('dB');
    await page.mouse.move(0, 0);
  });

  it('frames the stack at about half the field view by default, with the whole incident pulse in front where the stack allows; zooms with the buttons and the wheel; resets', async () => {
    const field = async (): Promise<Stats['field']> => (await stats()).field;
    const width = (w: [number, number]): number => w[1] - w[0];
    for (const preset of ['default', 'double-glazing']) {
      await choosePreset(preset);
      const f = await field();
      expect(f.window_mm).toEqual(f.default_mm);
      // About half: between 40 % and 50 % of the width (the workbench's framing rule).
      const share = f.stack_mm / width(f.window_mm);
      expect(share, preset).toBeGreaterThanOrEqual(0.4 - 1e-9);
      expect(share, preset).toBeLessThanOrEqual(0.5 + 1e-9);
      expect(f.window_mm[0]).toBeLessThan(0);
      expect(f.window_mm[1]).toBeGreaterThan(f.stack_mm);
    }
    // Zoom in and out by the buttons (a factor 1.5 each) and back.
    const f0 = await field();
    await page.click('[data-testid="zoom-in"]');
    await expect.poll(async () => width((await field()).window_mm)).toBeCloseTo(width(f0.window_mm) / 1.5, 6);
    expect((await field()).zoomed).toBe(true);
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-zoomed.png') });
    await page.click('[data-testid="zoom-out"]');
    await page.click('[data-testid="zoom-out"]');
    await expect.poll(async () => width((await field()).window_mm)).toBeGreaterThan(width(f0.window_mm));
    await page.click('[data-testid="zoom-reset"]');
    await expect.poll(async () => (await field()).window_mm).toEqual(f0.default_mm);
    // The wheel over the plot zooms in about the pointer.
    const box = (await page.locator('[data-testid="field-view"] canvas').boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.wheel(0, -240);
    await expect.poll(async () => width((await field()).window_mm)).toBeLessThan(width(f0.window_mm) * 0.9);
    await page.click('[data-testid="zoom-reset"]');
    await expect.poll(async () => (await field()).window_mm).toEqual(f0.default_mm);

    // A stack thicker than the pulse: half the width, and in front the incident pulse's whole length
    // (where its envelope exp(−(t/τ)²) is above 10 %: 2τ√ln 10 of time, at c in the air in front).
    const thick = { title: 'Foam block for the framing check', band_GHz: [2, 8], layers: [{ material: 'foam', thickness_mm: 250 }], materials: { foam: { model: 'fixed', eps_r: 1.5 } } };
    const path = join(ARTIFACTS, 'downloads', 'thick-foam.stack.json');
    writeFileSync(path, JSON.stringify(thick));
    await page.setInputFiles('[data-testid="import"]', path);
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return Math.abs(s.field.stack_mm - 250) < 1e-9 && s.field.grid && s.solvedVersion === s.version;
    });
    const ft = await field();
    expect(ft.stack_mm / width(ft.window_mm)).toBeCloseTo(0.5, 9);
    const pulse_mm = 2 * tauOfBand(2, 8) * Math.sqrt(Math.LN10) * C0 * 1e3;
    expect(-ft.window_mm[0]).toBeGreaterThanOrEqual(pulse_mm);

    // Two sheets, one of them at the same place as a third: three separate caps that do not overlap.
    const sheets = {
      title: 'Two-film absorber with a doubled film', band_GHz: [6, 14],
      layers: [{ material: 'film-a' }, { material: 'spacer', thickness_mm: 5 }, { material: 'film-b' }, { material: 'film-a' }, { material: 'spacer', thickness_mm: 5 }],
      back: 'pec',
      materials: { 'film-a': { model: 'sheet', ohm_per_sq: 300 }, 'film-b': { model: 'sheet', ohm_per_sq: 900 }, spacer: { model: 'fixed', eps_r: 1.1 } },
    };
    writeFileSync(path, JSON.stringify(sheets));
    await page.setInputFiles('[data-testid="import"]', path);
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return Math.abs(s.field.stack_mm - 10) < 1e-9 && s.field.grid && s.solvedVersion === s.version;
    });
    await expect.poll(async () => (await probe('fieldMarks')).plan.sheets.length).toBe(3);
    const marks = await probe('fieldMarks');
    const caps = marks.plan.sheets.map((m) => m.cap_px).sort((x, y) => x - y);
    for (let i = 1; i < caps.length; i++) expect(caps[i] - caps[i - 1]).toBeGreaterThanOrEqual(marks.tagWidth);
    // Each sheet's label is beside its cap or in the key, never dropped.
    for (const m of marks.plan.sheets) expect(m.label !== null || marks.plan.key.some((k) => k.startsWith(`${m.number} `))).toBe(true);
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-sheets.png') });
    await choosePreset('default');
  });

  it('makes a material of every model in the editor, refuses bad values in the parser\'s words, plots ε and μ, and solves it as an imported file with the same material does', async () => {
    await choosePreset('default');
    const editor = page.locator('[data-testid="material-editor"]');
    const field = (id: string) => editor.locator(`[data-testid="${id}"]`);
    const msg = page.locator('[data-testid="msg-edit"]');
    const settled = () => page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.solvedVersion === s.version;
    });
    const commit = async (id: string, text: string): Promise<void> => { await field(id).fill(text); await field(id).press('Enter'); };
    await field('me-new').click();
    await commit('me-name', 'loaded-foam');
    await expect.poll(() => field('me-name').inputValue()).toBe('loaded-foam');
    // Every model's starting definition passes the parser (no refusal), and the plot follows.
    for (const model of ['sheet', 'fixed', 'lorentz', 'drude', 'power-law', 'table', 'debye']) {
      await field('me-model').selectOption(model);
      await expect.poll(() => field('me-model').inputValue()).toBe(model);
      expect(await msg.count(), model).toBe(0);
    }
    // A table's rows are checked cell by cell: a loss below zero is named by its row and column.
    await field('me-model').selectOption('table');
    await field('me-points').fill('1, 2.2, 0.01\n6, 2.1, -0.02');
    await field('me-points').blur();
    await expect.poll(() => msg.textContent()).toContain('materials.loaded-foam.points[1][2]');
    await field('me-model').selectOption('debye');
    await commit('me-field-eps_inf', '1.8');
    await commit('me-field-sigma_S_per_m', '0.01');
    await commit('me-pole-0-delta_eps', '2.5');
    await commit('me-pole-0-tau_ps', '30');
    await field('me-magnetic').check();
    await field('me-mag-model').selectOption('lorentz');
    await commit('me-mag-mu_inf', '1');
    await commit('me-mag-pole-0-delta_mu', '0.5');
    await commit('me-mag-pole-0-f0_GHz', '4');
    await commit('me-mag-pole-0-gamma_GHz', '3');
    // Refused in the parser's words, and the value in force comes back.
    await commit('me-field-eps_inf', 'abc');
    await expect.poll(() => msg.textContent()).toContain('materials.loaded-foam.eps_inf: must be a number ≥ 1 (got the string "abc")');
    await expect.poll(() => field('me-field-eps_inf').inputValue()).toBe('1.8');
    await commit('me-mag-pole-0-f0_GHz', '0');
    await expect.poll(() => msg.textContent()).toContain('materials.loaded-foam.magnetic.poles[0].f0_GHz');
    // The plot reads ε′ of the Debye model at 2 GHz: ε∞ + Δε / (1 + (ωτ)²) (Debye 1929, the relaxation's closed form).
    const w = 2 * Math.PI * 2e9, tau = 30e-12;
    const epsRe = 1.8 + 2.5 / (1 + (w * tau) ** 2);
    await page.locator('[data-testid="material-plot"]').scrollIntoViewIfNeeded();
    const pt = (await probe('chartPoint', 'material-plot', 2, 0))!;
    await page.mouse.move(pt.x, pt.y);
    const readout = page.locator('[data-testid="material-plot-readout"]');
    await expect.poll(() => readout.textContent()).toContain('f = 2 GHz');
    const row = await readout.locator('.readout-row').first().locator('.readout-value').textContent();
    expect(Math.abs(Number(row) - epsRe)).toBeLessThanOrEqual(5e-5 + 1e-12);
    await editor.screenshot({ path: join(ARTIFACTS, 'material-editor.png') });
    await page.mouse.move(0, 0);
    // The layer uses it; the solve is then that of a file holding the same material, typed by hand.
    await page.locator('[data-testid="layer-0-material"] select').selectOption('loaded-foam');
    await settled();
    const fromEditor = await probe('solvedSpectrum');
    const byHand = {
      title: 'Single brick wall', band_GHz: [1, 6], points: 501, layers: [{ material: 'loaded-foam', thickness_mm: 100 }],
      materials: { 'loaded-foam': { model: 'debye', eps_inf: 1.8, poles: [{ delta_eps: 2.5, tau_ps: 30 }], sigma_S_per_m: 0.01,
        magnetic: { model: 'lorentz', mu_inf: 1, poles: [{ delta_mu: 0.5, f0_GHz: 4, gamma_GHz: 3 }] } } },
    };
    const path = join(ARTIFACTS, 'downloads', 'loaded-foam.stack.json');
    writeFileSync(path, JSON.stringify(byHand));
    // Deleting a material a layer uses is refused by the parser (the layer is named).
    await field('me-delete').click();
    await expect.poll(() => msg.textContent()).toContain('layers[0].material');
    const v = (await stats()).version;
    await page.setInputFiles('[data-testid="import"]', path);
    await page.waitForFunction((n) => { const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats; return s.version > n && s.solvedVersion === s.version; }, v);
    const fromFile = await probe('solvedSpectrum');
    expect(fromFile).not.toBeNull();
    expect(fromFile!.map((c) => c.name)).toEqual(fromEditor!.map((c) => c.name));
    fromFile!.forEach((c, k) => expect(c.data, c.name).toEqual(fromEditor![k].data));
    // And both are the exact solution of that file in node (the solver's own checks are in test/tmm).
    const parsed = parseStackObject(byHand);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    const f = Float64Array.from(fromFile!.find((c) => c.name === 'f_GHz')!.data, (x) => x * 1e9);
    const exact = solveTmm(parsed.stack, f);
    const Rre = fromFile!.find((c) => c.name === 'R_tmm_re')!.data;
    expect(Math.max(...Rre.map((x, i) => Math.abs(x - exact.R_re[i])))).toBeLessThan(1e-12);
    await expect.poll(() => field('me-name').inputValue()).toBe('loaded-foam');
  });

  it('runs a sweep (a map) and a tolerance study (p05–p95 bands on the spectrum) in a worker, with the numbers `slabecho sweep` and `slabecho tolerance` write', async () => {
    await choosePreset('default');
    const panel = page.locator('[data-testid="study-panel"]');
    const status = panel.locator('[data-testid="study-status"]');
    await panel.locator('[data-testid="study-axis"]').fill('incidence.angle_deg=0:60:20');
    await panel.locator('[data-testid="study-sweep"]').click();
    await expect.poll(() => status.textContent(), { timeout: 30_000 }).toMatch(/sweep: done/);
    const { dir, cleanup } = tempDir();
    try {
      const file = join(dir, 'wall.stack.json');
      writeFileSync(file, JSON.stringify(DEFAULT_PRESET));
      // The command line's sweep of the same stack: sweep.csv, one row per case and frequency.
      const sw = await cli('sweep', file, '--angle', '0:60:20', '--out', join(dir, 'sweep'));
      expect(sw.code, sw.stderr).toBe(0);
      const csv = readCsv(readFileSync(join(dir, 'sweep', 'sweep.csv'), 'utf8'));
      for (const q of ['IL_dB', 'R_power'] as const) {
        await panel.locator('[data-testid="study-quantity"]').selectOption(q);
        await expect.poll(async () => (await probe('studyMap'))?.quantity).toBe(q);
        const map = (await probe('studyMap'))!;
        expect(map.values).toEqual([0, 20, 40, 60]);
        const col = csv.header.indexOf(q);
        expect(map.data.length).toBe(csv.rows.length);
        csv.rows.forEach((row, i) => expect(Math.abs(map.data[i] - row[col]), `${q} row ${i}`).toBeLessThanOrEqual(1e-11 * Math.max(1, Math.abs(row[col]))));
      }
      await page.locator('[data-testid="study-view"]').screenshot({ path: join(ARTIFACTS, 'study-view.png') });

      // Tolerance: the same samples (seed 7) as the command line, the same percentiles.
      await panel.locator('[data-testid="study-vary"]').fill('layers[0].thickness_mm:normal:2');
      await panel.locator('[data-testid="study-samples"]').fill('60');
      await panel.locator('[data-testid="study-seed"]').fill('7');
      await panel.locator('[data-testid="study-tolerance"]').click();
      await expect.poll(() => status.textContent(), { timeout: 30_000 }).toMatch(/tolerance study: done/);
      const tol = await cli('tolerance', file, '--vary', 'layers[0].thickness_mm:normal:2', '--samples', '60', '--seed', '7', '--out', join(dir, 'tol'));
      expect(tol.code, tol.stderr).toBe(0);
      const want = readFileSync(join(dir, 'tol', 'tolerance.csv'), 'utf8');
      const got = (await probe('tolerance'))!;
      expect(got.samples).toBe(60);
      expect(formatCsv(got.columns.map((c) => ({ name: c.name, data: Float64Array.from(c.data) })))).toBe(want);
      // The band is on the spectrum: the readout at 5.2 GHz gives its edges, 10 log10 of R_power's p05 and p95.
      const wantRows = readCsv(want), at = wantRows.rows.findIndex((r) => Math.abs(r[0] - 5.2) < 1e-9);
      await page.locator('[data-testid="spectrum-view"]').scrollIntoViewIfNeeded();
      const pt = (await probe('chartPoint', 'spectrum-view', 5.2, 0))!;
      await page.mouse.move(pt.x, pt.y);
      const readout = page.locator('[data-testid="spectrum-view-readout"]');
      await expect.poll(() => readout.textContent()).toContain('p05–p95 of 60 samples p05');
      const edge = async (name: string): Promise<number> => Number((await readout.locator('.readout-row', { hasText: `samples ${name}` }).first().locator('.readout-value').textContent())!.replace('−', '-').replace(/\s*dB$/, ''));
      for (const [name, col] of [['p05', 'R_power_p05'], ['p95', 'R_power_p95']] as const) {
        expect(Math.abs(await edge(name) - 10 * Math.log10(wantRows.rows[at][wantRows.header.indexOf(col)]))).toBeLessThanOrEqual(0.0005 + 1e-9);
      }
      await page.locator('[data-testid="spectrum-view"]').screenshot({ path: join(ARTIFACTS, 'spectrum-view-tolerance.png') });
      await page.mouse.move(0, 0);
      // The export carries tolerance.csv as the command line writes it, and the map's picture.
      const [zip] = await downloadsOf(() => page.click('[data-testid="export"]'), 1);
      const entries = unzipSync(new Uint8Array(await saved(zip)));
      const byName = new Map(Object.entries(entries).map(([k, v]) => [k.slice(k.indexOf('/') + 1), Buffer.from(v)]));
      expect(byName.get('tolerance.csv')?.toString('utf8')).toBe(want);
      expect([...byName.get('study-view.png')!.subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
    } finally {
      cleanup();
    }
    // An edit drops the results (they belong to the stack they ran on) and says so.
    await page.locator('[data-testid="layer-0-thickness"] input').fill('101');
    await page.locator('[data-testid="layer-0-thickness"] input').press('Enter');
    await expect.poll(() => page.locator('[data-testid="study-view"]').getAttribute('data-empty')).toMatch(/changed since the sweep/);
    // A path the stack does not have is refused in the studies core's words.
    await panel.locator('[data-testid="study-axis"]').fill('layers[7].thickness_mm=1:3:1');
    await panel.locator('[data-testid="study-sweep"]').click();
    await expect.poll(() => page.locator('[data-testid="msg-study"]').textContent()).toContain('layers[7]');
    await choosePreset('default');
  });

  it('draws a measured CSV on the spectrum and matches a slab\'s thickness to it from the panel, then applies the tuned stack', async () => {
    // A synthetic measurement: the exact solution of a 12.3 mm slab of ε_r = 4.4 (complex R and T, 41 rows).
    const slab = (d: number) => ({ title: 'Sample under test', band_GHz: [2, 10], points: 201, layers: [{ material: 'sample', thickness_mm: d }], materials: { sample: { model: 'fixed', eps_r: 4.4 } } });
    const truth = parseStackObject(slab(12.3));
    if (!truth.ok) throw new Error(truth.errors.join('; '));
    const f = Float64Array.from({ length: 41 }, (_, k) => (2 + 0.2 * k) * 1e9);
    const x = solveTmm(truth.stack, f);
    const lines = ['f_GHz,R_re,R_im,T_re,T_im', ...Array.from(f, (v, k) => [v / 1e9, x.R_re[k], x.R_im[k], x.T_re[k], x.T_im[k]].map((n) => String(Number(n.toPrecision(12)))).join(','))];
    const dir = join(ARTIFACTS, 'downloads');
    writeFileSync(join(dir, 'sample.csv'), `${lines.join('\n')}\n`);
    writeFileSync(join(dir, 'sample.stack.json'), JSON.stringify(slab(10)));
    await page.setInputFiles('[data-testid="import"]', join(dir, 'sample.stack.json'));
    await page.waitForFunction(() => document.querySelector('[data-testid="stack-title"]')?.textContent === 'Sample under test');
    const panel = page.locator('[data-testid="tune-panel"]');
    await page.setInputFiles('[data-testid="measured-import"]', join(dir, 'sample.csv'));
    await expect.poll(() => panel.locator('[data-testid="measured-status"]').textContent()).toBe('sample.csv: 41 rows, R_re, R_im, T_re, T_im');
    // Drawn beside the methods: the readout names it, with |R| of the measured row at 6 GHz.
    await expect.poll(() => probe('chartRange', 'spectrum-view')).toEqual([2, 10]);
    await page.locator('[data-testid="spectrum-view"]').scrollIntoViewIfNeeded();
    const pt = (await probe('chartPoint', 'spectrum-view', 6, 0))!;
    await page.mouse.move(pt.x, pt.y);
    const readout = page.locator('[data-testid="spectrum-view-readout"]');
    await expect.poll(() => readout.textContent()).toContain('measured (sample.csv)');
    const shown = Number((await readout.locator('.readout-row', { hasText: 'measured' }).first().locator('.readout-value').textContent())!.replace('−', '-').replace(/\s*dB.*$/, ''));
    expect(Math.abs(shown - 20 * Math.log10(Math.hypot(x.R_re[20], x.R_im[20])))).toBeLessThanOrEqual(0.0005 + 1e-9);
    await page.locator('[data-testid="spectrum-view"]').screenshot({ path: join(ARTIFACTS, 'spectrum-view-measured.png') });
    await page.mouse.move(0, 0);
    await panel.locator('[data-testid="tune-goal"]').selectOption('match');
    await panel.locator('[data-testid="tune-free"]').fill('layers[0].thickness_mm=5:20');
    await panel.locator('[data-testid="tune-budget"]').fill('60');
    await panel.locator('[data-testid="tune-run"]').click();
    const result = panel.locator('[data-testid="tune-result"]');
    await expect.poll(() => result.textContent(), { timeout: 60_000 }).toMatch(/evaluations in/);
    const best = Number(/layers\[0\]\.thickness_mm = ([\d.]+)/.exec((await result.textContent())!)![1]);
    expect(Math.abs(best - 12.3)).toBeLessThan(1e-4);
    await panel.screenshot({ path: join(ARTIFACTS, 'tune-panel.png') });
    await panel.locator('[data-testid="tune-apply"]').click();
    await expect.poll(async () => Number(await page.locator('[data-testid="layer-0-thickness"] input').inputValue())).toBeCloseTo(12.3, 4);
    await panel.locator('[data-testid="measured-clear"]').click();
    await choosePreset('default');
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

  it('refuses text that is not a number in a number field, naming the field, and clears older errors (also on a preset switch)', async () => {
    await choosePreset('default');
    const thickness = page.locator('[data-testid="layer-0-thickness"] input');
    const before = await thickness.inputValue();
    const msg = page.locator('[data-testid="msg-edit"]');
    await thickness.fill('-4');
    await thickness.press('Enter');
    await expect.poll(() => msg.textContent()).toContain('layers[0].thickness_mm');
    const v1 = (await stats()).version;
    await thickness.fill('abc');
    await thickness.press('Enter');
    // The newer refusal replaces the older one.
    await expect.poll(() => msg.textContent()).toContain('"abc"');
    expect(await msg.textContent()).toContain('layers[0].thickness_mm');
    expect(await msg.textContent()).not.toContain('-4');
    expect((await stats()).version).toBe(v1);
    await expect(thickness.inputValue()).resolves.toBe(before);
    // A decimal comma is not read as the number before it: refused, and the old value is back.
    await thickness.fill('12,5');
    await thickness.press('Enter');
    await expect.poll(() => msg.textContent()).toContain('"12,5"');
    await expect.poll(() => thickness.inputValue()).toBe(before);
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.solvedVersion === s.version;
    });
    // A view setting is refused with its name too.
    const lambda = page.locator('[data-testid="lambda-GHz"] input');
    await lambda.fill('abc');
    await lambda.press('Enter');
    await expect.poll(() => msg.textContent()).toContain('wavelengths at (GHz)');
    // A preset switch clears it.
    await choosePreset('meeting-room-partition');
    expect(await msg.count()).toBe(0);
  });

  it('names an imported or edited stack in the preset menu, also after a reload', async () => {
    const file = { title: 'Review panel', band_GHz: [2, 6], layers: [{ material: 'plywood', thickness_mm: 18 }] };
    const path = join(ARTIFACTS, 'downloads', 'review-panel.stack.json');
    writeFileSync(path, JSON.stringify(file));
    await page.setInputFiles('[data-testid="import"]', path);
    await expect.poll(presetShown).toBe('imported: review-panel.stack.json');
    await page.reload();
    await page.waitForFunction(() => (window as unknown as { slabecho?: { stats: Stats } }).slabecho?.stats.solvedVersion === 0);
    await expect.poll(presetShown).toBe('imported: review-panel.stack.json');
    await choosePreset('salisbury-absorber');
    await expect.poll(presetShown).toBe('salisbury-absorber');
    const t = page.locator('[data-testid="layer-1-thickness"] input');
    await t.fill('7.5');
    await t.press('Enter');
    await expect.poll(presetShown).toBe('salisbury-absorber (edited)');
    await page.reload();
    await page.waitForFunction(() => (window as unknown as { slabecho?: { stats: Stats } }).slabecho?.stats.solvedVersion === 0);
    await expect.poll(presetShown).toBe('salisbury-absorber (edited)');
    // Choosing the preset again goes back to it.
    await choosePreset('salisbury-absorber');
    await expect.poll(presetShown).toBe('salisbury-absorber');
    await expect(page.locator('[data-testid="layer-1-thickness"] input').inputValue()).resolves.toBe('7.32');
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

  it('runs oblique TE and TM in the pulse engine alike, and says once, in words, why a stack it cannot step has no pulse run', async () => {
    const state = (): Promise<string | null> => page.locator('[data-testid="run-status"]').getAttribute('data-state');
    await page.locator('[data-testid="preset"] select').selectOption('radome-panel');
    await page.waitForSelector('[data-testid="run-status"][data-state="done"]', { timeout: 120_000 });
    await expect(page.locator('[data-testid="agreement"]').textContent()).resolves.toMatch(/FDTD vs exact/);
    expect(await page.locator('[data-testid="msg-pulse"]').count()).toBe(0);
    await page.evaluate(() => window.scrollTo(0, 0)); // keep the sticky top bar off the screenshots
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-oblique-TE.png') });
    // TM at the same angle: a pulse run like TE's, with its FDTD row and echoes.
    await page.locator('[data-testid="polarization"] select').selectOption('TM');
    await page.waitForFunction(() => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.reportVersion === s.version && document.querySelector<HTMLElement>('[data-testid="run-status"]')?.dataset.state === 'done';
    }, undefined, { timeout: 120_000 });
    expect(await page.locator('[data-testid="msg-pulse"]').count()).toBe(0);
    await expect(page.locator('[data-testid="agreement"]').textContent()).resolves.toMatch(/FDTD vs exact/);
    expect(await page.locator('[data-testid="trace-view"]').getAttribute('data-empty')).toBeFalsy();
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.locator('[data-testid="field-view"]').screenshot({ path: join(ARTIFACTS, 'field-view-oblique-TM.png') });
    await page.locator('[data-testid="trace-view"]').screenshot({ path: join(ARTIFACTS, 'trace-view-oblique-TM.png') });
    await page.locator('[data-testid="profile-view"]').screenshot({ path: join(ARTIFACTS, 'profile-view-oblique-TM.png') });

    // An air gap seen from glass beyond the critical angle asin(1/2) = 30° (Snell's law): no stable stepping.
    const gap = {
      title: 'Air gap behind a glass block', band_GHz: [2, 6], front: 'block', back: 'block',
      layers: [{ material: 'air', thickness_mm: 5 }], materials: { block: { model: 'fixed', eps_r: 4 } },
      incidence: { angle_deg: 40, polarization: 'TM' },
    };
    const path = join(ARTIFACTS, 'downloads', 'air-gap.stack.json');
    writeFileSync(path, JSON.stringify(gap));
    await page.setInputFiles('[data-testid="import"]', path);
    const refusal = page.locator('[data-testid="msg-pulse"]');
    await refusal.waitFor();
    await expect(refusal.textContent()).resolves.toMatch(/no stable stepping/);
    // The batch run ends saying the engine declined the stack, not that it finished.
    await expect.poll(state).toBe('declined');
    await expect(page.locator('[data-testid="run-status"]').textContent()).resolves.not.toMatch(/finished/);
    // The empty echoes view says why it is empty.
    await expect.poll(() => page.locator('[data-testid="trace-view"]').getAttribute('data-empty')).toMatch(/did not run.*no stable stepping/);
    // The refusal is not repeated among the warnings, and no FDTD row or echo is claimed.
    expect(await page.locator('[data-testid="msg-warnings"]', { hasText: 'FDTD skipped' }).count()).toBe(0);
    const agreement = await page.locator('[data-testid="agreement"]').textContent();
    expect(agreement).toMatch(/FEM vs exact/);
    expect(agreement).not.toMatch(/FDTD/);
    await choosePreset('default');
  });

  it('at 1024 px keeps the field view\'s title clear of its legend and shows the whole panel', async () => {
    await page.setViewportSize({ width: 1024, height: 768 });
    try {
      await choosePreset('double-glazing'); // the longest title
      await page.evaluate(() => window.scrollTo(0, 0));
      const canvas = page.locator('[data-testid="field-view"] canvas');
      await expect.poll(async () => (await canvas.boundingBox())?.width ?? 0).toBeLessThan(700);
      await page.waitForTimeout(200);
      const boxes = await probe('fieldBoxes');
      const overlap = (a: { x: number; y: number; w: number; h: number }, b: typeof a): boolean =>
        a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
      expect(boxes.title.w).toBeGreaterThan(50);
      expect(overlap(boxes.title, boxes.legend)).toBe(false);
      expect(overlap(boxes.clock, boxes.legend)).toBe(false);
      const cw = (await canvas.boundingBox())!.width;
      expect(boxes.legend.x + boxes.legend.w).toBeLessThanOrEqual(cw);
      // Nothing sticks out sideways, and every row of the panel lies inside it and can be scrolled to.
      const m = await page.evaluate(() => {
        const panel = document.querySelector('[data-testid="controls"]')!;
        const r = panel.getBoundingClientRect();
        const rows = [...panel.querySelectorAll('.lil-controller')].map((c) => c.getBoundingClientRect());
        const view = document.querySelector('[data-testid="field-view"]')!.getBoundingClientRect();
        const fieldCanvas = document.querySelector('[data-testid="field-view"] canvas')!.getBoundingClientRect();
        return {
          scrollW: document.documentElement.scrollWidth, innerW: window.innerWidth, panelLeft: r.left, panelRight: r.right,
          worstRight: Math.max(...rows.map((x) => x.right)), worstLeft: Math.min(...rows.map((x) => x.left)),
          canvasRight: fieldCanvas.right, viewRight: view.right, scrollable: panel.scrollHeight - panel.clientHeight,
        };
      });
      expect(m.scrollW).toBeLessThanOrEqual(m.innerW);
      expect(m.panelRight).toBeLessThanOrEqual(m.innerW + 0.5);
      expect(m.worstRight).toBeLessThanOrEqual(m.panelRight + 0.5);
      expect(m.worstLeft).toBeGreaterThanOrEqual(m.panelLeft - 0.5);
      expect(m.canvasRight).toBeLessThanOrEqual(m.viewRight + 0.5);
      if (m.scrollable > 0) {
        await page.locator('[data-testid="controls"]').evaluate((p) => { p.scrollTop = p.scrollHeight; });
        const last = page.locator('[data-testid="controls"] .lil-controller').last();
        const lb = (await last.boundingBox())!;
        expect(lb.y + lb.height).toBeLessThanOrEqual(768 + 0.5);
        await page.locator('[data-testid="controls"]').evaluate((p) => { p.scrollTop = 0; });
      }
      await page.screenshot({ path: join(ARTIFACTS, 'workbench-1024.png') });
    } finally {
      await page.setViewportSize({ width: 1440, height: 1200 });
    }
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
