// Making a clip, page side: ask the worker when the pulse reaches the stack and when the view is quiet
// again, step the run there frame by frame (each frame the same number of steps), draw the field view
// with its caption, and hand each picture to the encoder with its own timestamp. It runs as fast as the
// machine allows; the clip plays at its frame rate regardless.

import type { FieldFrame } from '../protocol.ts';
import { ClipCanvas } from './caption.ts';
import type { ClipTiming } from './scout.ts';
import { openSink, type ClipFormat } from './sinks.ts';
import { clipFrames } from './timing.ts';

export interface ClipDriver {
  timing(window_m: [number, number]): Promise<ClipTiming>;
  /** A frame of the run at exactly this step. */
  seek(step: number): Promise<FieldFrame>;
  /** The next frame, `steps` further. */
  advance(steps: number): Promise<FieldFrame>;
  /** Draw the frame into the field view now. */
  show(frame: FieldFrame): void;
  progress(note: string): void;
  cancelled(): boolean;
}

export interface ClipRequest {
  format: ClipFormat;
  length_s: number;
  fps: number;
  title: string;
  /** The part of the grid the field view shows, metres. */
  window_m: [number, number];
  fieldCanvas: HTMLCanvasElement;
}

export interface Clip {
  blob: Blob;
  extension: ClipFormat;
  description: string;
  frames: number;
  fps: number;
  duration_s: number;
  stepsPerFrame: number;
  start_ns: number;
  end_ns: number;
  /** The incident pulse's envelope peak at the front face. */
  arrival_ns: number;
  ends: ClipTiming['ends'];
}

/** Record a clip; null when cancelled; throws with a reason when this browser cannot. */
export async function makeClip(req: ClipRequest, d: ClipDriver): Promise<Clip | null> {
  d.progress('finding when the pulse reaches the stack and leaves the view…');
  const timing = await d.timing(req.window_m);
  const plan = clipFrames(timing, req.length_s, req.fps);
  const ns = (step: number): number => step * timing.dt_s * 1e9;
  const comment = `slabecho field view, t = ${ns(timing.startStep).toFixed(3)} to ${ns(timing.startStep + (plan.frames - 1) * plan.stepsPerFrame).toFixed(3)} ns, `
    + `${plan.stepsPerFrame} steps per frame at ${req.fps} frames/s`;
  const picture = new ClipCanvas(req.fieldCanvas, req.title);
  const sink = await openSink(picture.canvas, { format: req.format, fps: req.fps, title: req.title, comment });
  if (typeof sink === 'string') throw new Error(sink);
  let frame = await d.seek(timing.startStep);
  for (let k = 0; k < plan.frames; k++) {
    if (d.cancelled()) { await sink.cancel(); return null; }
    if (k > 0) frame = await d.advance(plan.stepsPerFrame);
    d.show(frame);
    picture.draw(frame.time_s * 1e9, k / Math.max(1, plan.frames - 1));
    await sink.add(k);
    if (k % 10 === 0) d.progress(`encoding frame ${k + 1} of ${plan.frames}…`);
  }
  d.progress('finishing the file…');
  const blob = await sink.finish();
  return {
    blob, extension: sink.extension, description: sink.description, frames: plan.frames, fps: req.fps,
    duration_s: plan.duration_s, stepsPerFrame: plan.stepsPerFrame, start_ns: ns(timing.startStep),
    end_ns: ns(timing.startStep + (plan.frames - 1) * plan.stepsPerFrame), arrival_ns: timing.arrival_s * 1e9, ends: timing.ends,
  };
}
