// The workbench's keys: Space plays or pauses the pulse run, → steps it; both are ignored while the user types
// in a field or a dialog, or holds a modifier.

export interface PlayKeys { togglePlay(): void; stepOnce(): void }

export function wirePlayKeys(actions: PlayKeys): void {
  const typing = (e: KeyboardEvent): boolean => {
    const t = e.target as HTMLElement | null;
    return t !== null && t.closest('input, select, textarea, dialog, [contenteditable="true"]') !== null;
  };
  const isSpace = (e: KeyboardEvent): boolean => e.key === ' ' || e.code === 'Space';
  window.addEventListener('keydown', (e) => {
    if (typing(e) || e.altKey || e.ctrlKey || e.metaKey) return;
    if (isSpace(e)) { e.preventDefault(); if (!e.repeat) actions.togglePlay(); }
    else if (e.key === 'ArrowRight') { e.preventDefault(); actions.stepOnce(); }
  });
  // Space on a focused button would also click it on key-up: space always means play/pause here.
  window.addEventListener('keyup', (e) => { if (isSpace(e) && !typing(e)) e.preventDefault(); });
}
