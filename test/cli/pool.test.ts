// The CLI's worker-thread pool (src/cli/pool.ts): tasks give on a worker exactly what they give in this thread,
// a failing task rejects with its message, and without workers the pool works in the calling thread.
import { afterEach, describe, expect, it } from 'vitest';
import { TaskPool, workersEnabled } from '../../src/cli/pool.ts';
import { runTask } from '../../src/cli/tasks.ts';
import { loadStackFile } from '../../src/cli/io.ts';
import type { Stack } from '../../src/stack/types.ts';

function preset(name: string): Stack {
  const r = loadStackFile(`presets/${name}.stack.json`);
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.stack;
}

const saved = process.env.SLABECHO_WORKERS;
afterEach(() => { if (saved === undefined) delete process.env.SLABECHO_WORKERS; else process.env.SLABECHO_WORKERS = saved; });

describe('TaskPool', () => {
  it('from the sources it works in this thread unless asked, and SLABECHO_WORKERS=0 always keeps it there', async () => {
    delete process.env.SLABECHO_WORKERS;
    expect(workersEnabled()).toBe(false);
    const pool = new TaskPool();
    expect(pool.size).toBe(0);
    const stack = preset('salisbury-absorber');
    const r = await pool.run('solve', { stack, options: {} });
    expect(r.spectrum[0].name).toBe('f_GHz');
    await pool.close();
    process.env.SLABECHO_WORKERS = '0';
    expect(workersEnabled()).toBe(false);
  });

  it('on worker threads: the same report as in this thread, tasks queued past the pool size, failures rejected', async () => {
    process.env.SLABECHO_WORKERS = '2';
    const pool = new TaskPool();
    try {
      expect(pool.size).toBe(2);
      const stacks = ['salisbury-absorber', 'radome-panel', 'double-glazing'].map(preset);
      const remote = await Promise.all(stacks.map((stack) => pool.run('solve', { stack, options: {} })));
      stacks.forEach((stack, i) => {
        const here = runTask('solve', { stack, options: {} });
        expect(remote[i].spectrum.map((c) => c.name)).toEqual(here.spectrum.map((c) => c.name));
        remote[i].spectrum.forEach((c, j) => expect(Array.from(c.data)).toEqual(Array.from(here.spectrum[j].data)));
        expect(remote[i].agreement).toEqual(here.agreement);
      });
      const bad = { ...stacks[0], layers: null } as unknown as Stack;
      expect(() => runTask('solve', { stack: bad, options: {} })).toThrow();
      await expect(pool.run('solve', { stack: bad, options: {} })).rejects.toThrow();
      // The pool still works after a failure.
      expect((await pool.run('solve', { stack: stacks[0], options: {} })).agreement).toEqual(remote[0].agreement);
    } finally {
      await pool.close();
    }
  });
});
