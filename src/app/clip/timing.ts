// How a clip spreads the run over its frames: every frame advances the run by the same number of
// steps, so the clip shows the same motion on any machine, and the frames cover the span from the
// start step to the end step in about the chosen length.

import type { ClipTiming } from './scout.ts';

export interface ClipFrames {
  frames: number;
  stepsPerFrame: number;
  /** Playing time, s. */
  duration_s: number;
}

/** Frames at `fps` for a clip of about `length_s` over the timing's steps (at least two frames). */
export function clipFrames(t: Pick<ClipTiming, 'startStep' | 'endStep'>, length_s: number, fps: number): ClipFrames {
  const span = Math.max(1, t.endStep - t.startStep);
  const wanted = Math.max(2, Math.round(length_s * fps));
  const stepsPerFrame = Math.max(1, Math.ceil(span / (wanted - 1)));
  const frames = Math.ceil(span / stepsPerFrame) + 1;
  return { frames, stepsPerFrame, duration_s: frames / fps };
}
