// The work a command may do: output bytes, computing time and memory, each estimated before anything heavy is
// allocated (estimate.ts) and refused in plain words when over. Also the plain-word forms of those figures.

export interface WorkBudget {
  /** Largest total size of the files a command writes, bytes (the CLI's --max-output-MB, 10^6 bytes each). */
  maxOutput_bytes: number;
  /** Largest estimated computing time, seconds (the CLI's --max-seconds). */
  maxSeconds: number;
  /** Largest estimated memory, bytes. */
  maxMemory_bytes: number;
}

export const DEFAULT_BUDGET: Readonly<WorkBudget> = Object.freeze({
  maxOutput_bytes: 50e6,
  maxSeconds: 30,
  maxMemory_bytes: 1.5e9,
});

/** A budget with the given parts replaced. */
export const budgetWith = (parts: Partial<WorkBudget> = {}): WorkBudget => ({ ...DEFAULT_BUDGET, ...parts });

/** "about 3 min", "about 40 s", "under a second". */
export function plainDuration(seconds: number): string {
  if (seconds < 1) return 'under a second';
  if (seconds < 90) return `about ${Math.round(seconds)} s`;
  if (seconds < 5400) return `about ${Math.round(seconds / 60)} min`;
  if (seconds < 2 * 86400) return `about ${Math.round(seconds / 3600)} h`;
  return `about ${Math.round(seconds / 86400)} days`;
}

/** "48 MB", "1.2 GB", "350 kB" (decimal units). */
export function plainBytes(bytes: number): string {
  const units: [number, string][] = [[1e9, 'GB'], [1e6, 'MB'], [1e3, 'kB']];
  for (const [u, name] of units) if (bytes >= u) return `${Number((bytes / u).toPrecision(bytes / u < 10 ? 2 : 3))} ${name}`;
  return `${Math.round(bytes)} bytes`;
}

/** A count in plain digits with a word for millions: "9.7 million", "343", "12 000". */
export function plainCount(n: number): string {
  if (n >= 1e9) return `${Number((n / 1e9).toPrecision(2))} billion`;
  if (n >= 1e6) return `${Number((n / 1e6).toPrecision(2))} million`;
  return Math.round(n).toLocaleString('en-US').replace(/,/g, ' ');
}
