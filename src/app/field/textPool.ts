// pixi Text objects reused between redraws of the static layer: a text with the same words, size and
// colour is taken from the pool instead of being made (and measured, and rasterised) again, which
// keeps zooming and panning smooth.

import { Container, Text } from 'pixi.js';
import { THEME } from '../theme.ts';

export class TextPool {
  private readonly free = new Map<string, Text[]>();
  private readonly used = new Map<string, Text[]>();

  constructor(private readonly parent: Container) {}

  /** A text in the parent container (at 0, 0 until placed). */
  get(text: string, fill: string = THEME.inkSoft, size = 11, font: string = THEME.font): Text {
    const key = `${size}|${fill}|${font}|${text}`;
    const t = this.free.get(key)?.pop() ?? new Text({ text, style: { fontFamily: font, fontSize: size, fill } });
    const list = this.used.get(key);
    if (list === undefined) this.used.set(key, [t]); else list.push(t);
    t.visible = true;
    if (t.parent !== this.parent) this.parent.addChild(t);
    return t;
  }

  /** Give a text back before the sweep (it was measured but not placed). */
  drop(t: Text): void { t.visible = false; }

  /** Start a redraw: everything in use becomes free. */
  begin(): void {
    for (const [key, list] of this.used) {
      const f = this.free.get(key);
      if (f === undefined) this.free.set(key, list); else f.push(...list);
    }
    this.used.clear();
  }

  /** End a redraw: texts in use go to whole pixels (a text between pixels is drawn blurred), those not used are destroyed. */
  sweep(): void {
    for (const list of this.used.values()) for (const t of list) t.position.set(Math.round(t.x), Math.round(t.y));
    for (const list of this.free.values()) for (const t of list) { t.removeFromParent(); t.destroy(); }
    this.free.clear();
  }
}
