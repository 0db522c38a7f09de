// Where clip frames go. With WebCodecs (mediabunny's CanvasSource), each frame is encoded with its
// exact timestamp k / fps, and the finished file carries its duration: WebM with VP9 (VP8 when VP9 is
// missing) or MP4 with H.264. Without WebCodecs, MediaRecorder records the canvas in real time, one
// requested frame every 1 / fps seconds, as WebM.

export type ClipFormat = 'webm' | 'mp4';

export interface ClipSink {
  /** "VP9 in WebM (WebCodecs)" … */
  readonly description: string;
  readonly extension: ClipFormat;
  /** Add the canvas as it is now as frame k. */
  add(k: number): Promise<void>;
  finish(): Promise<Blob>;
  cancel(): Promise<void>;
}

export interface SinkOptions {
  format: ClipFormat;
  fps: number;
  title: string;
  /** Stored in the file's comment tag. */
  comment: string;
}

export const webCodecsPresent = (): boolean => typeof VideoEncoder !== 'undefined' && typeof VideoFrame !== 'undefined';

export const mediaRecorderPresent = (): boolean =>
  typeof MediaRecorder !== 'undefined' && typeof HTMLCanvasElement.prototype.captureStream === 'function' && webmRecorderType() !== null;

/** A sink for the canvas in the wanted format; null with a reason when this browser cannot make it. */
export async function openSink(canvas: HTMLCanvasElement, o: SinkOptions): Promise<ClipSink | string> {
  if (webCodecsPresent()) {
    const mb = await import('mediabunny');
    const size = { width: canvas.width, height: canvas.height };
    const codecs = o.format === 'mp4' ? (['avc'] as const) : (['vp9', 'vp8'] as const);
    let codec: (typeof codecs)[number] | null = null;
    for (const c of codecs) if (await mb.canEncodeVideo(c, size)) { codec = c; break; }
    if (codec === null) {
      if (o.format === 'mp4') return 'this browser cannot encode H.264 for an MP4 clip; choose WebM';
    } else {
      const output = new mb.Output({
        format: o.format === 'mp4' ? new mb.Mp4OutputFormat({ fastStart: 'in-memory' }) : new mb.WebMOutputFormat(),
        target: new mb.BufferTarget(),
      });
      const source = new mb.CanvasSource(canvas, { codec, bitrate: mb.QUALITY_HIGH, keyFrameInterval: 1 });
      output.addVideoTrack(source, { frameRate: o.fps });
      output.setMetadataTags({ title: o.title, comment: o.comment, date: new Date() });
      await output.start();
      const mime = o.format === 'mp4' ? 'video/mp4' : 'video/webm';
      return {
        description: `${codec === 'avc' ? 'H.264 in MP4' : `${codec.toUpperCase()} in WebM`} (WebCodecs)`,
        extension: o.format,
        add: (k) => source.add(k / o.fps, 1 / o.fps),
        finish: async () => {
          await output.finalize();
          const buf = output.target.buffer;
          if (buf === null) throw new Error('the encoder gave no file');
          return new Blob([buf], { type: mime });
        },
        cancel: () => output.cancel(),
      };
    }
  }
  if (o.format === 'mp4') return 'this browser has no WebCodecs encoder for an MP4 clip; choose WebM';
  if (!mediaRecorderPresent()) return 'this browser can record neither with WebCodecs nor with MediaRecorder (WebM)';
  return recorderSink(canvas, o.fps);
}

function webmRecorderType(): string | null {
  for (const t of ['video/webm;codecs=vp9', 'video/webm;codecs=vp8', 'video/webm']) {
    if (typeof MediaRecorder !== 'undefined' && MediaRecorder.isTypeSupported(t)) return t;
  }
  return null;
}

/** Real-time fallback: a frame is requested, then the next one 1 / fps later. */
function recorderSink(canvas: HTMLCanvasElement, fps: number): ClipSink {
  const stream = canvas.captureStream(0);
  const track = stream.getVideoTracks()[0] as CanvasCaptureMediaStreamTrack;
  const recorder = new MediaRecorder(stream, { mimeType: webmRecorderType() ?? 'video/webm', videoBitsPerSecond: 4_000_000 });
  const chunks: Blob[] = [];
  const done = new Promise<Blob>((resolve) => {
    recorder.ondataavailable = (e) => { if (e.data.size > 0) chunks.push(e.data); };
    recorder.onstop = () => { for (const t of stream.getTracks()) t.stop(); resolve(new Blob(chunks, { type: 'video/webm' })); };
  });
  recorder.start(500);
  let next = performance.now();
  return {
    description: 'WebM (MediaRecorder, real time; no WebCodecs in this browser)',
    extension: 'webm',
    add: async () => {
      const wait = next - performance.now();
      if (wait > 0) await new Promise((ok) => setTimeout(ok, wait));
      track.requestFrame();
      next = Math.max(next, performance.now()) + 1000 / fps;
    },
    finish: () => { if (recorder.state !== 'inactive') recorder.stop(); return done; },
    cancel: async () => { if (recorder.state !== 'inactive') recorder.stop(); await done; },
  };
}
