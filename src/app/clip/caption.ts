// The picture a clip is made of: the field view as drawn, with a caption strip under it (the stack
// title on the left, the run's time on the right, a thin bar for the clip's progress). Its size is
// even in both directions, as H.264 needs.

import { THEME } from '../theme.ts';
import { fitText } from '../charts/paint.ts';

const STRIP_CSS_PX = 34;

export class ClipCanvas {
  readonly canvas: HTMLCanvasElement;
  private readonly ctx: CanvasRenderingContext2D;
  private readonly scale: number;

  constructor(private readonly source: HTMLCanvasElement, private readonly title: string) {
    this.scale = source.width / Math.max(1, source.clientWidth || source.width);
    const strip = Math.round(STRIP_CSS_PX * this.scale);
    this.canvas = document.createElement('canvas');
    this.canvas.width = 2 * Math.ceil(source.width / 2);
    this.canvas.height = 2 * Math.ceil((source.height + strip) / 2);
    const ctx = this.canvas.getContext('2d');
    if (ctx === null) throw new Error('2D canvas unavailable');
    this.ctx = ctx;
  }

  /** Copy the field view now and caption it with the time (ns) and the clip's progress (0…1). */
  draw(time_ns: number, progress: number): void {
    const { ctx, canvas, source } = this;
    const s = this.scale;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.fillStyle = THEME.panel;
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(source, 0, 0);
    const top = source.height, h = canvas.height - top;
    ctx.fillStyle = THEME.ink;
    ctx.fillRect(0, top, canvas.width, h);
    ctx.fillStyle = THEME.reflected;
    ctx.fillRect(0, canvas.height - Math.max(2, 2 * s), canvas.width * Math.min(1, Math.max(0, progress)), Math.max(2, 2 * s));
    ctx.textBaseline = 'middle';
    const time = `t = ${time_ns.toFixed(3)} ns`;
    ctx.font = `${Math.round(13 * s)}px ${THEME.mono}`;
    const tw = ctx.measureText(time).width;
    ctx.fillStyle = '#ffffff';
    ctx.textAlign = 'right';
    ctx.fillText(time, canvas.width - 12 * s, top + h / 2);
    ctx.font = `600 ${Math.round(13 * s)}px ${THEME.font}`;
    ctx.textAlign = 'left';
    ctx.fillText(fitText(ctx, this.title, canvas.width - tw - 48 * s), 12 * s, top + h / 2);
  }
}

