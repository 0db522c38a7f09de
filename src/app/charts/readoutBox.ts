// The cursor readout: a small box beside the cursor line listing every series' value at the sample
// under the pointer, grouped by panel. Plain DOM (not part of the chart's PNG); placed through the
// CSSOM, styled by classes in style.css.

export interface ReadoutRow { label: string; color: string; dash?: number[]; value: string }
export interface ReadoutGroup { title: string; rows: ReadoutRow[] }

export class ReadoutBox {
  private readonly el: HTMLDivElement;

  constructor(host: HTMLElement, testid: string) {
    this.el = document.createElement('div');
    this.el.className = 'chart-readout';
    this.el.dataset.testid = testid;
    this.el.hidden = true;
    host.append(this.el);
  }

  hide(): void { this.el.hidden = true; }

  /** Fill and place the box: right of the cursor line at px, or left of it when it would not fit. */
  show(head: string, groups: ReadoutGroup[], px: number, top: number, width: number): void {
    const doc = this.el.ownerDocument;
    const parts: HTMLElement[] = [];
    const h = doc.createElement('div');
    h.className = 'readout-head';
    h.textContent = head;
    parts.push(h);
    for (const g of groups) {
      const t = doc.createElement('div');
      t.className = 'readout-group';
      t.textContent = g.title;
      parts.push(t);
      for (const r of g.rows) {
        const row = doc.createElement('div');
        row.className = 'readout-row';
        const sw = doc.createElement('span');
        sw.className = r.dash !== undefined && r.dash.length > 0 ? 'readout-swatch dashed' : 'readout-swatch';
        sw.style.borderTopColor = r.color;
        const label = doc.createElement('span');
        label.className = 'readout-label';
        label.textContent = r.label;
        const value = doc.createElement('span');
        value.className = 'readout-value';
        value.textContent = r.value;
        row.append(sw, label, value);
        parts.push(row);
      }
    }
    this.el.replaceChildren(...parts);
    this.el.hidden = false;
    const w = this.el.offsetWidth;
    const x = px + 14 + w <= width - 4 ? px + 14 : Math.max(4, px - 14 - w);
    this.el.style.left = `${Math.round(x)}px`;
    this.el.style.top = `${Math.round(top)}px`;
  }
}
