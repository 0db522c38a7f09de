// Pointer and wheel input on the field view's canvas: the wheel (and a trackpad pinch, which arrives
// as a wheel event with ctrlKey) zooms about the pointer, a drag pans, two touching fingers pinch,
// a press in the overview strip moves the view there, a double click resets the framing.

export type Region = 'plot' | 'strip' | null;

export interface GestureTarget {
  /** The part of the canvas under a point (CSS pixels from the canvas's top left). */
  regionAt(x: number, y: number): Region;
  /** Zoom by `factor` (< 1 zooms in) about the pixel column x. */
  zoomAt(factor: number, x: number): void;
  /** Move the view so the content follows the pointer by dx pixels. */
  panBy(dx: number): void;
  /** Centre the view on the position under pixel x of the overview strip. */
  stripTo(x: number): void;
  reset(): void;
}

const LINE_PX = 16, PAGE_PX = 400;
/** Zoom per wheel pixel, and per pixel of a trackpad pinch (common practice, no source). */
const WHEEL_RATE = 0.0015, PINCH_RATE = 0.01;

export function attachGestures(canvas: HTMLCanvasElement, t: GestureTarget): void {
  const local = (e: { clientX: number; clientY: number }): { x: number; y: number } => {
    const r = canvas.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  };
  canvas.addEventListener('wheel', (e) => {
    const p = local(e);
    if (t.regionAt(p.x, p.y) === null) return;
    e.preventDefault();
    const unit = e.deltaMode === 1 ? LINE_PX : e.deltaMode === 2 ? PAGE_PX : 1;
    const delta = (Math.abs(e.deltaY) >= Math.abs(e.deltaX) ? e.deltaY : e.deltaX) * unit;
    t.zoomAt(Math.exp(delta * (e.ctrlKey ? PINCH_RATE : WHEEL_RATE)), p.x);
  }, { passive: false });

  const down = new Map<number, { x: number; y: number }>();
  let mode: 'pan' | 'strip' | 'pinch' | null = null;
  let pinchDistance = 0;
  const spread = (): { d: number; mid: number } => {
    const [a, b] = [...down.values()];
    return { d: Math.hypot(a.x - b.x, a.y - b.y), mid: (a.x + b.x) / 2 };
  };
  canvas.addEventListener('pointerdown', (e) => {
    const p = local(e);
    const region = t.regionAt(p.x, p.y);
    if (region === null || (e.pointerType === 'mouse' && e.button !== 0)) return;
    canvas.setPointerCapture(e.pointerId);
    down.set(e.pointerId, p);
    if (down.size === 2) { mode = 'pinch'; pinchDistance = spread().d; }
    else if (region === 'strip') { mode = 'strip'; t.stripTo(p.x); }
    else mode = 'pan';
    canvas.classList.toggle('panning', mode === 'pan');
  });
  canvas.addEventListener('pointermove', (e) => {
    const prev = down.get(e.pointerId);
    if (prev === undefined) return;
    const p = local(e);
    down.set(e.pointerId, p);
    if (mode === 'pinch' && down.size === 2) {
      const s = spread();
      if (pinchDistance > 0 && s.d > 0) t.zoomAt(pinchDistance / s.d, s.mid);
      pinchDistance = s.d;
    } else if (mode === 'pan') t.panBy(p.x - prev.x);
    else if (mode === 'strip') t.stripTo(p.x);
  });
  const up = (e: PointerEvent): void => {
    if (!down.delete(e.pointerId)) return;
    if (down.size === 0) mode = null;
    else if (mode === 'pinch') mode = 'pan';
    canvas.classList.toggle('panning', mode === 'pan');
  };
  canvas.addEventListener('pointerup', up);
  canvas.addEventListener('pointercancel', up);
  canvas.addEventListener('dblclick', (e) => {
    const p = local(e);
    if (t.regionAt(p.x, p.y) === 'plot') t.reset();
  });
}
