// Workbench benchmark (not a test): builds the app, serves it, and in headless chromium measures
//  1. the field view's frame rate while the pulse run steps, on the default preset, at the default
//     framing and zoomed in twice (the overview strip drawn too);
//     also while the full pulse run steps in its worker (recording the space–time map) and while a tolerance study
//     runs in the study worker (the share of the window each was busy is printed beside it);
//  2. edit-to-update time of the exact and FEM views (an edit in the stack editor until both charts
//     have redrawn with the new solution) on every preset.
// Targets from the workbench issue: ≥ 55 fps; ≤ 100 ms edit-to-update.
// Run: npm run bench:ui  [-- --json]

import type { Page } from 'playwright-core';
import { buildApp, launch, removeDir, serveStatic } from './harness.ts';

interface Stats {
  fieldRenders: number; step: number; playing: boolean; version: number; solvedVersion: number;
  lastEditToUpdate_ms: number | null; lastSolve_ms: number | null; renderer: string;
}
const stats = (page: Page): Promise<Stats> =>
  page.evaluate(() => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats);

const median = (xs: number[]): number => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };
const r1 = (x: number): number => Math.round(x * 10) / 10;

/**
 * While `busy` (a page expression) holds, sampled every 50 ms over `seconds`: how long it held, and the field
 * view's frames per second over exactly those intervals.
 */
function whileBusy(page: Page, busy: string, seconds: number): Promise<{ busy_s: number; fps: number }> {
  return page.evaluate(`new Promise((done) => {
    const renders = () => window.slabecho.stats.fieldRenders;
    let t = performance.now(), r = renders(), was = ${busy}, busyT = 0, busyR = 0; const t0 = t;
    const tick = () => {
      const now = performance.now(), rn = renders(), is = ${busy};
      if (was) { busyT += now - t; busyR += rn - r; }
      t = now; r = rn; was = is;
      if (now - t0 < ${seconds * 1000}) setTimeout(tick, 50); else done({ busy_s: busyT / 1000, fps: busyT > 0 ? busyR / (busyT / 1000) : 0 });
    };
    setTimeout(tick, 50);
  })`) as Promise<{ busy_s: number; fps: number }>;
}

async function measureFps(page: Page, seconds: number, alongside?: () => Promise<void>): Promise<{ fps: number; rafHz: number; stepsPerFrame: number; renderer: string }> {
  await page.waitForFunction(() => (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats.step >= 0);
  await page.click('[data-testid="reset"]');
  await page.click('[data-testid="play"]');
  if (alongside !== undefined) await alongside();
  await page.waitForTimeout(1000);
  // The display's own frame rate over the same window (a string: tsx would decorate a function).
  const rafHz = page.evaluate(`new Promise((done) => {
    let n = 0; const t0 = performance.now();
    const tick = () => { n++; if (performance.now() - t0 < ${seconds * 1000}) requestAnimationFrame(tick); else done((n * 1000) / (performance.now() - t0)); };
    requestAnimationFrame(tick);
  })`) as Promise<number>;
  const a = await stats(page);
  const t0 = Date.now();
  await page.waitForTimeout(seconds * 1000);
  const b = await stats(page);
  const dt = (Date.now() - t0) / 1000;
  await page.click('[data-testid="play"]');
  const steps = b.step - a.step, frames = b.fieldRenders - a.fieldRenders;
  return { fps: frames / dt, rafHz: await rafHz, stepsPerFrame: frames > 0 ? steps / frames : 0, renderer: b.renderer };
}

async function editTimes(page: Page, preset: string, edits: number): Promise<{ preset: string; edit: string; times_ms: number[]; solve_ms: number[] }> {
  await page.locator('[data-testid="preset"] select').selectOption(preset);
  await page.waitForFunction(() => { const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats; return s.solvedVersion === s.version; });
  await page.waitForTimeout(500);
  const thickness = page.locator('[data-testid^="layer-"][data-testid$="-thickness"] input').first();
  const hasLayer = await thickness.count() > 0;
  const which = hasLayer ? await page.locator('[data-testid^="layer-"][data-testid$="-thickness"]').first().getAttribute('data-testid') : null;
  const input = hasLayer ? thickness : page.locator('[data-testid="angle"] input').last();
  const base = Number(await input.inputValue());
  const times: number[] = [], solves: number[] = [];
  for (let k = 1; k <= edits; k++) {
    const before = (await stats(page)).version;
    const value = hasLayer ? base * (1 + 0.01 * k) : k;
    await input.fill(String(Number(value.toPrecision(6))));
    await input.press('Enter');
    await page.waitForFunction((v) => {
      const s = (window as unknown as { slabecho: { stats: Stats } }).slabecho.stats;
      return s.version > v && s.solvedVersion === s.version && s.lastEditToUpdate_ms !== null;
    }, before);
    const s = await stats(page);
    times.push(s.lastEditToUpdate_ms ?? NaN);
    solves.push(s.lastSolve_ms ?? NaN);
    await page.waitForTimeout(400);
  }
  const layerNo = which === null ? 0 : Number(/layer-(\d+)-/.exec(which)?.[1] ?? 0) + 1;
  return { preset, edit: hasLayer ? `layer ${layerNo} thickness` : 'incidence angle', times_ms: times, solve_ms: solves };
}

async function main(): Promise<void> {
  const json = process.argv.includes('--json');
  const dist = await buildApp();
  const site = await serveStatic(dist);
  const browser = await launch({ width: 1440, height: 1000 });
  try {
    const page = await browser.context.newPage();
    await page.goto(site.url);
    await page.waitForFunction(() => (window as unknown as { slabecho?: { stats: Stats } }).slabecho?.stats.solvedVersion === 0);
    await page.waitForTimeout(1500);
    const fps = await measureFps(page, 5);
    await page.click('[data-testid="zoom-in"]');
    await page.click('[data-testid="zoom-in"]');
    const fpsZoomed = await measureFps(page, 3);
    await page.click('[data-testid="zoom-reset"]');
    // While the full run steps (and records the space–time map): "run again", then measure at once.
    const RUN_BUSY = `document.querySelector('[data-testid="run-status"]').dataset.state === 'running'`;
    let duringRun = { busy_s: 0, fps: 0 };
    await measureFps(page, 3, async () => {
      await page.click('[data-testid="run-start"]');
      void whileBusy(page, RUN_BUSY, 3.5).then((x) => { duringRun = x; });
    });
    await page.waitForSelector('[data-testid="run-status"][data-state="done"]', { timeout: 120_000 });
    // While a tolerance study of 3000 samples runs in the study worker.
    await page.locator('[data-testid="study-samples"]').fill('3000');
    const STUDY_BUSY = `!document.querySelector('[data-testid="study-cancel"]').disabled`;
    let duringStudy = { busy_s: 0, fps: 0 };
    await measureFps(page, 3, async () => {
      await page.click('[data-testid="study-tolerance"]');
      void whileBusy(page, STUDY_BUSY, 3.5).then((x) => { duringStudy = x; });
    });
    await page.click('[data-testid="study-cancel"]').catch(() => {});
    await page.waitForTimeout(1200);
    const presets = await page.locator('[data-testid="preset"] select option').allTextContents();
    const edits = [];
    for (const p of presets) edits.push(await editTimes(page, p, 5));
    const result = {
      field_view: {
        preset: 'default', fps: r1(fps.fps), fps_zoomed: r1(fpsZoomed.fps), raf_hz: r1(fps.rafHz), steps_per_frame: r1(fps.stepsPerFrame), renderer: fps.renderer, target_fps: 55,
        fps_during_full_run: r1(duringRun.fps), full_run_s: r1(duringRun.busy_s),
        fps_during_tolerance_study: r1(duringStudy.fps), study_s: r1(duringStudy.busy_s),
      },
      edit_to_update: edits.map((e) => ({
        preset: e.preset, edit: e.edit, median_ms: r1(median(e.times_ms)), max_ms: r1(Math.max(...e.times_ms)),
        solve_median_ms: r1(median(e.solve_ms)), target_ms: 100,
      })),
    };
    if (json) { console.log(JSON.stringify(result, null, 2)); return; }
    console.log(`field view (default preset, ${result.field_view.renderer} renderer): ${result.field_view.fps} fps, zoomed in ${result.field_view.fps_zoomed} fps ` +
      `(display ${result.field_view.raf_hz} Hz, ${result.field_view.steps_per_frame} steps per frame; target ≥ 55)`);
    console.log(`  while the full run records the space–time map: ${result.field_view.fps_during_full_run} fps (over the ${result.field_view.full_run_s} s it ran); ` +
      `while a 3000-sample tolerance study runs: ${result.field_view.fps_during_tolerance_study} fps (over ${result.field_view.study_s} s)`);
    console.log('edit → exact + FEM views redrawn (target ≤ 100 ms):');
    for (const e of result.edit_to_update) {
      console.log(`  ${e.preset.padEnd(26)} ${e.edit.padEnd(18)} median ${String(e.median_ms).padStart(6)} ms   max ${String(e.max_ms).padStart(6)} ms   (solve ${e.solve_median_ms} ms)`);
    }
  } finally {
    await browser.close();
    await site.close();
    removeDir(dist);
  }
}

main().catch((e: unknown) => { console.error(e instanceof Error ? e.message : e); process.exitCode = 1; });
