// Small DOM builders for the panel's own sections (material editor, studies, tuning): elements with a class,
// text boxes, buttons and labelled rows, each with a data-testid where the tests need one.

export function el(tag: string, cls: string, text?: string): HTMLElement {
  const e = document.createElement(tag);
  e.className = cls;
  if (text !== undefined) e.textContent = text;
  return e;
}

export function textInput(value: string, testid: string): HTMLInputElement {
  const i = document.createElement('input');
  i.type = 'text';
  i.value = value;
  i.dataset.testid = testid;
  i.autocomplete = 'off';
  i.spellcheck = false;
  return i;
}

export function textArea(value: string, testid: string, rows = 3): HTMLTextAreaElement {
  const a = document.createElement('textarea');
  a.value = value;
  a.dataset.testid = testid;
  a.rows = rows;
  a.spellcheck = false;
  return a;
}

export function button(text: string, testid: string, click: () => void, disabled = false): HTMLButtonElement {
  const b = document.createElement('button');
  b.type = 'button';
  b.className = 'small';
  b.textContent = text;
  b.dataset.testid = testid;
  b.disabled = disabled;
  b.addEventListener('click', click);
  return b;
}

export function select(options: ReadonlyArray<[value: string, label: string]>, value: string, testid: string): HTMLSelectElement {
  const s = document.createElement('select');
  s.dataset.testid = testid;
  for (const [v, l] of options) s.append(new Option(l, v, false, v === value));
  return s;
}

/** A row: a label, then the control (beside it, or under it when `block`). */
export function labelled(text: string, control: HTMLElement, block = false): HTMLElement {
  const row = el('label', block ? 'editor-row editor-block' : 'editor-row');
  row.append(el('span', 'editor-label', text), control);
  return row;
}
