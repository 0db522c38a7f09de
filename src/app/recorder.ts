// WebM clips of the field view: canvas.captureStream(0) takes a frame only when asked, and the page
// asks once per drawn animation frame, each of which advanced the run by the same number of steps.

export class ClipRecorder {
  private readonly recorder: MediaRecorder;
  private readonly track: CanvasCaptureMediaStreamTrack;
  private readonly chunks: Blob[] = [];
  private readonly finished: Promise<Blob>;
  frames = 0;

  static supported(): boolean {
    return typeof MediaRecorder !== 'undefined' && typeof HTMLCanvasElement.prototype.captureStream === 'function'
      && pickType() !== null;
  }

  constructor(canvas: HTMLCanvasElement, readonly stepsPerFrame: number) {
    const stream = canvas.captureStream(0);
    this.track = stream.getVideoTracks()[0] as CanvasCaptureMediaStreamTrack;
    const mimeType = pickType() ?? 'video/webm';
    this.recorder = new MediaRecorder(stream, { mimeType, videoBitsPerSecond: 4_000_000 });
    this.finished = new Promise<Blob>((resolve) => {
      this.recorder.ondataavailable = (e) => { if (e.data.size > 0) this.chunks.push(e.data); };
      this.recorder.onstop = () => {
        for (const t of stream.getTracks()) t.stop();
        resolve(new Blob(this.chunks, { type: 'video/webm' }));
      };
    });
    this.recorder.start(500);
  }

  /** Capture the canvas as it is now. */
  frame(): void {
    if (this.recorder.state !== 'recording') return;
    this.track.requestFrame();
    this.frames++;
  }

  /** Stop and return the clip. */
  stop(): Promise<Blob> {
    if (this.recorder.state !== 'inactive') this.recorder.stop();
    return this.finished;
  }
}

function pickType(): string | null {
  for (const t of ['video/webm;codecs=vp9', 'video/webm;codecs=vp8', 'video/webm']) {
    if (typeof MediaRecorder !== 'undefined' && MediaRecorder.isTypeSupported(t)) return t;
  }
  return null;
}
