// What the workbench tells about a clip it saved: the figures the tests read (stats.lastClip) and the message.

import type { WorkbenchStats } from '../stats.ts';
import type { Clip } from './session.ts';

/** The clip's figures for window.slabecho.stats. */
export function clipStats(name: string, clip: Clip): NonNullable<WorkbenchStats['lastClip']> {
  return {
    name, description: clip.description, frames: clip.frames, fps: clip.fps, duration_s: clip.duration_s, bytes: clip.blob.size,
    start_ns: clip.start_ns, end_ns: clip.end_ns, arrival_ns: clip.arrival_ns, stepsPerFrame: clip.stepsPerFrame,
  };
}

/** "Clip saved as NAME: 4.0 s, 120 frames of 8 steps, t = … ns, …, 512 KiB." */
export function clipSavedNote(name: string, clip: Clip): string {
  return `Clip saved as ${name}: ${clip.duration_s.toFixed(1)} s, ${clip.frames} frames of ${clip.stepsPerFrame} steps, `
    + `t = ${clip.start_ns.toFixed(3)} to ${clip.end_ns.toFixed(3)} ns${clip.ends === 'run-end' ? ' (the run ended before the view was quiet)' : ''}, `
    + `${clip.description}, ${(clip.blob.size / 1024).toFixed(0)} KiB.`;
}
