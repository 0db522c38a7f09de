// The message strip above the views: errors (refused edits and imports, failed runs), warnings from
// the parser and the engines, and short notes. Each message has a key so it can be replaced or cleared.

type Level = 'error' | 'warn' | 'info';

export class Messages {
  private readonly boxes = new Map<string, HTMLElement>();

  constructor(private readonly host: HTMLElement) {}

  /** Show a message under `key`, in place of the one it replaces (so the strip does not reorder). */
  show(key: string, level: Level, title: string, items: readonly string[]): void {
    const box = document.createElement('div');
    box.className = `msg ${level}`;
    box.dataset.testid = `msg-${key}`;
    box.setAttribute('role', level === 'error' ? 'alert' : 'status');
    const head = document.createElement('span');
    head.textContent = title;
    box.appendChild(head);
    const close = document.createElement('button');
    close.type = 'button';
    close.className = 'small';
    close.textContent = 'dismiss';
    close.addEventListener('click', () => this.clear(key));
    box.appendChild(close);
    if (items.length > 0) {
      const ul = document.createElement('ul');
      for (const t of items.slice(0, 50)) {
        const li = document.createElement('li');
        li.textContent = t;
        ul.appendChild(li);
      }
      if (items.length > 50) {
        const li = document.createElement('li');
        li.textContent = `… and ${items.length - 50} more`;
        ul.appendChild(li);
      }
      box.appendChild(ul);
    }
    const old = this.boxes.get(key);
    if (old !== undefined) old.replaceWith(box); else this.host.appendChild(box);
    this.boxes.set(key, box);
  }

  clear(key: string): void {
    this.boxes.get(key)?.remove();
    this.boxes.delete(key);
  }

  /** Replace the warnings message with these lists (duplicates dropped). */
  warnings(...lists: ReadonlyArray<readonly string[]>): void {
    const all = [...new Set(lists.flat())];
    if (all.length === 0) this.clear('warnings');
    else this.show('warnings', 'warn', 'Warnings for this stack:', all);
  }
}
