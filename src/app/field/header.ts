// The field view's header: the stack title and the time readout on the left, the trace legend on
// the right. On a narrow canvas the legend moves down beside the time readout, and the title is
// shortened only when nothing else makes room, so the title never overprints the legend.

export interface Box { x: number; y: number; w: number; h: number }

export interface HeaderInput {
  left: number;
  right: number;
  titleW: number;
  legendW: number;
  /** Width of the widest time readout. */
  clockW: number;
  /** Space kept between neighbours. */
  gap: number;
}

export interface HeaderLayout {
  /** Row of the legend: 0 beside the title, 1 beside the time readout. */
  legendRow: 0 | 1;
  /** Left edge of the legend. */
  legendX: number;
  /** Widest the title may be drawn (it is cut with an ellipsis beyond that). */
  titleMaxW: number;
}

export function headerLayout(h: HeaderInput): HeaderLayout {
  const avail = h.right - h.left;
  const legendX = h.right - h.legendW;
  if (h.titleW + h.gap + h.legendW <= avail) return { legendRow: 0, legendX, titleMaxW: h.titleW };
  if (h.clockW + h.gap + h.legendW <= avail) return { legendRow: 1, legendX, titleMaxW: Math.min(h.titleW, avail) };
  // Neither row holds the legend beside its text: keep it beside the title and shorten the title.
  return { legendRow: 0, legendX, titleMaxW: Math.max(0, avail - h.legendW - h.gap) };
}

/** True when two boxes share some area (an empty box shares none). */
export const overlaps = (a: Box, b: Box): boolean =>
  a.w > 0 && a.h > 0 && b.w > 0 && b.h > 0 && a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
