// Pointer input on a chart's overlay: hovering moves the cursor readout, a drag draws a zoom box
// (released: zoom to it), a double click resets the zoom.

export interface DragBox { x0: number; y0: number; x1: number; y1: number }

export interface ChartInputTarget {
  /** True over a panel's plot area (CSS pixels from the chart's top left). */
  inPlot(x: number, y: number): boolean;
  hover(p: { x: number; y: number } | null): void;
  /** The box being dragged, or null when the drag ended without zooming. */
  drag(b: DragBox | null): void;
  zoomTo(b: DragBox): void;
  reset(): void;
}

/** A drag shorter than this in x (and in y) is a click, not a zoom box. */
const MIN_DRAG_X = 6, MIN_DRAG_Y = 12;

export function attachChartInput(el: HTMLElement, t: ChartInputTarget): void {
  const local = (e: PointerEvent | MouseEvent): { x: number; y: number } => {
    const r = el.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  };
  let start: { x: number; y: number; id: number } | null = null;
  el.addEventListener('pointerdown', (e) => {
    const p = local(e);
    if (e.button !== 0 || !t.inPlot(p.x, p.y)) return;
    start = { ...p, id: e.pointerId };
    el.setPointerCapture(e.pointerId);
  });
  el.addEventListener('pointermove', (e) => {
    const p = local(e);
    if (start !== null && e.pointerId === start.id) t.drag({ x0: start.x, y0: start.y, x1: p.x, y1: p.y });
    t.hover(p);
  });
  const end = (e: PointerEvent, cancelled: boolean): void => {
    if (start === null || e.pointerId !== start.id) return;
    const p = local(e), b = { x0: start.x, y0: start.y, x1: p.x, y1: p.y };
    start = null;
    if (!cancelled && (Math.abs(b.x1 - b.x0) >= MIN_DRAG_X || Math.abs(b.y1 - b.y0) >= MIN_DRAG_Y)) t.zoomTo(b);
    else t.drag(null);
  };
  el.addEventListener('pointerup', (e) => end(e, false));
  el.addEventListener('pointercancel', (e) => end(e, true));
  el.addEventListener('pointerleave', () => { if (start === null) t.hover(null); });
  el.addEventListener('dblclick', (e) => { const p = local(e); if (t.inPlot(p.x, p.y)) t.reset(); });
}
