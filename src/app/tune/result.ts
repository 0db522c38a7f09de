// A tuning's result in a few lines for the panel: the best value of each free path (with its 95 % interval for
// match), the objective, the residual, and every warning of tune.json, in the summary's own numbers.

import type { TuneResult } from '../studies/compute.ts';

const g = (x: unknown): string => (typeof x === 'number' ? String(Number(x.toPrecision(6))) : String(x));

export function resultLines(r: TuneResult, ms: number): string[] {
  if (r.stopped || r.tunedFile === null) return ['stopped before any result'];
  const s = r.summary as {
    goal?: string; best?: Record<string, number>; interval_95?: Record<string, [number, number] | null>;
    objective?: { name: string; value: number; dB?: number | null }; residual?: { rms?: number; noise_estimate?: number };
    evaluations?: { total: number }; warnings?: string[];
  };
  const lines = [`${s.goal ?? 'tuning'}: ${s.evaluations?.total ?? '?'} evaluations in ${(ms / 1000).toFixed(2)} s`];
  for (const [path, v] of Object.entries(s.best ?? {})) {
    const i = s.interval_95?.[path];
    lines.push(`  ${path} = ${g(v)}${Array.isArray(i) ? `  (95 %: ${g(i[0])} … ${g(i[1])})` : ''}`);
  }
  if (s.objective !== undefined) lines.push(`  ${s.objective.name} = ${g(s.objective.value)}${typeof s.objective.dB === 'number' ? ` (${g(s.objective.dB)} dB)` : ''}`);
  if (s.residual?.rms !== undefined) lines.push(`  residual rms ${g(s.residual.rms)}${s.residual.noise_estimate !== undefined ? `, noise estimate ${g(s.residual.noise_estimate)}` : ''}`);
  for (const w of s.warnings ?? []) lines.push(`  warning: ${w}`);
  return lines;
}
