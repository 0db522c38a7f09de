// The pulse pipeline end to end: FDTD spectra against the exact solution, the back-face echo delay,
// no NaN anywhere, stopped and skipped runs.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runReport } from '../../src/report/run.ts';
import { assertTable, findColumn } from '../../src/report/table.ts';
import { parseStackText } from '../../src/stack/parse.ts';
import type { Stack } from '../../src/stack/types.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

const C0 = 299792458;

function preset(name: string): Stack {
  const r = parseStackText(readFileSync(`presets/${name}.stack.json`, 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.stack;
}

function expectNoNaN(r: Awaited<ReturnType<typeof runReport>>) {
  assertTable(r.spectrum);
  if (r.profile.length) assertTable(r.profile);
  assertTable(r.trace);
  for (const e of [r.echoes, r.echoesT]) if (e.path.length) assertTable(e.columns);
  assertTable(r.envelope);
  expect(JSON.stringify(r.summary)).not.toMatch(/NaN|Infinity/);
  // JSON.stringify writes NaN and ±Infinity as null, so the text alone cannot show them: the summary must
  // survive a round trip unchanged (a NaN would come back as null).
  expect(JSON.parse(JSON.stringify(r.summary))).toEqual(r.summary);
}

type Row = { pair: string; R_max: number; T_max: number };
const row = (r: Awaited<ReturnType<typeof runReport>>, pair: string): Row | undefined =>
  (r.summary.agreement as Row[]).find((a) => a.pair === pair);

describe('runReport', () => {
  it('lossless slab: FDTD within 0.01 of the exact solution; back-face echo 2 d √ε\'/c after the front face', async () => {
    // ε_r = 4, d = 50 mm in air, band 1–6 GHz. Closed forms (physics reference): front-face echo
    // r = −1/3; back-face echo delay 2 d √ε'/c = 0.6671 ns, amplitude t01 r12 t10 = 8/27.
    const d = 0.05;
    const stack = makeStack({ band_GHz: [1, 6], points: 41, layers: [layer(dielectric(4, 0, 'slab'), d)] });
    const r = await runReport(stack);
    expectNoNaN(r);
    const a = row(r, 'fdtd-tmm')!;
    expect(a.R_max).toBeLessThanOrEqual(0.01);
    expect(a.T_max).toBeLessThanOrEqual(0.01);
    for (const c of ['R_fdtd_re', 'R_fdtd_im', 'T_fdtd_re', 'T_fdtd_im']) expect(findColumn(r.spectrum, c)).toBeDefined();
    for (const c of ['E_fdtd_re', 'E_fdtd_im']) expect(findColumn(r.profile, c)).toBeDefined();
    // The two echoes are 1.25 band-pulse widths apart (0.535 ns over 1–6 GHz), so each one's main lobe
    // still pulls the other by a few picoseconds; the prediction, from every bounce path together, sees
    // the same and agrees with the run to a fraction of a picosecond.
    const tau = (2 * d * 2) / C0 * 1e9;
    const t = r.echoes.columns[0].data, amp = r.echoes.columns[2].data, pred = r.echoes.columns[3].data;
    expect(r.echoes.path.slice(0, 2)).toEqual(['front face', 'back face']);
    expect(r.echoes.resolved.slice(0, 2)).toEqual(['yes', 'yes']);
    expect(Math.abs(t[0])).toBeLessThan(5e-3); // ns
    expect(Math.abs(t[1] / tau - 1)).toBeLessThan(0.01);
    expect(Math.abs(t[1] - pred[1])).toBeLessThan(1e-3);
    expect(amp[0]).toBeCloseTo(-1 / 3, 2);
    expect(amp[1]).toBeCloseTo(8 / 27, 2);
    // summary.json repeats the echo table for a reader: delay, level, prediction and path of each echo
    const se = r.summary.echoes as { count: number; t_ns: number[]; level_dB: number[]; predicted_t_ns: number[]; path: string[]; resolved: boolean[]; paths: { path: string }[][]; floor_dB: number };
    expect(se.path.slice(0, 2)).toEqual(['front face', 'back face']);
    expect(se.level_dB[0]).toBeCloseTo(20 * Math.log10(1 / 3), 1);
    expect(Math.abs(se.predicted_t_ns[1] / tau - 1)).toBeLessThan(0.01);
    expect(se.floor_dB).toBe(-40);
    expect([se.t_ns.length, se.level_dB.length, se.predicted_t_ns.length, se.path.length, se.resolved.length, se.paths.length]).toEqual(Array(6).fill(se.count));
    // the transmitted table: the direct wave t01 t10 = 8/9 after d √ε / c (closed forms, physics reference)
    const st = r.summary.transmitted as { t_ns: number[]; level_dB: number[]; path: string[] };
    expect(st.path[0]).toBe('direct');
    expect(Math.abs(st.t_ns[0] / (tau / 2) - 1)).toBeLessThan(0.005);
    expect(st.level_dB[0]).toBeCloseTo(20 * Math.log10(8 / 9), 1);
    expect(r.echoesT.path[0]).toBe('direct');
    // the band envelopes for the workbench: the incident band pulse peaks at 0 dB at delay zero
    const env = (n: string) => findColumn(r.envelope, n)!.data;
    expect(Math.max(...env('incident_dB'))).toBeCloseTo(0, 3);
    // profile: FDTD against exact, same grid
    const e = (n: string) => findColumn(r.profile, n)!.data;
    let worst = 0;
    for (let i = 0; i < e('x_mm').length; i++) worst = Math.max(worst, Math.hypot(e('E_fdtd_re')[i] - e('E_tmm_re')[i], e('E_fdtd_im')[i] - e('E_tmm_im')[i]));
    expect(worst).toBeLessThan(0.02);
  });

  it('Salisbury preset: no NaN, FDTD within 0.01 of the exact solution, conductor echo named', async () => {
    const r = await runReport(preset('salisbury-absorber'));
    expectNoNaN(r);
    const a = row(r, 'fdtd-tmm')!;
    expect(a.R_max).toBeLessThanOrEqual(0.01);
    expect(r.echoes.path.some((p) => p.includes('conductor'))).toBe(true);
    expect((r.summary.run as { truncated: boolean }).truncated).toBe(false);
  });

  it('a run stopped at once is marked stopped and still holds no NaN', async () => {
    const stack = makeStack({ band_GHz: [1, 6], points: 11, layers: [layer(dielectric(4), 0.05)] });
    const r = await runReport(stack, { shouldStop: () => true });
    expect(r.stopped).toBe(true);
    expect(r.warnings.some((w) => w.includes('stopped'))).toBe(true);
    expectNoNaN(r);
  });

  it('oblique TM incidence runs like TE: FDTD columns, traces, echoes and its agreement row within the target', async () => {
    const stack = makeStack({ band_GHz: [1, 6], points: 11, angle_deg: 30, polarization: 'TM', layers: [layer(dielectric(4), 0.05)] });
    const r = await runReport(stack);
    expect(r.skipped).toBeUndefined();
    expect(findColumn(r.spectrum, 'R_fdtd_re')).toBeDefined();
    expect(r.trace[0].data.length).toBeGreaterThan(100);
    expect(r.echoes.path[0]).toMatch(/front face/);
    const row = r.agreement.find((a) => a.pair === 'fdtd-tmm')!;
    expect(Math.max(row.R_max, row.T_max)).toBeLessThan(0.01);
    expectNoNaN(r);
  });

  it('a medium evanescent up to any frequency is skipped with a warning, solve results kept', async () => {
    // From ε = 4 into air beyond the critical angle asin(1/2) = 30° (Snell's law, Born & Wolf §1.5).
    const stack = makeStack({ band_GHz: [1, 6], points: 11, angle_deg: 40, polarization: 'TM', front: dielectric(4), back: dielectric(4), layers: [layer(dielectric(1), 0.01)] });
    const r = await runReport(stack);
    expect(r.skipped).toMatch(/no stable stepping; use an angle below 30\.0°/);
    expect(r.warnings.join('\n')).toMatch(/FDTD skipped/);
    expect(findColumn(r.spectrum, 'R_tmm_re')).toBeDefined();
    expect(findColumn(r.spectrum, 'R_fdtd_re')).toBeUndefined();
    expect(r.trace[0].data.length).toBe(0);
    expect(r.echoes.path.length).toBe(0);
    expect(r.echoesT.path.length).toBe(0);
  });
});
