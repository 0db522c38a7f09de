// lil-gui's stylesheet, adopted through the CSSOM (a Content-Security-Policy with style-src 'self'
// blocks the <style> element lil-gui would inject) and without its embedded icon font (font-src
// 'self' refuses data: fonts); the arrows and check marks then come from the page font.

import lilGuiCss from '../../node_modules/lil-gui/dist/lil-gui.css?raw';

export function adoptGuiStyles(): void {
  const css = lilGuiCss
    .replace(/@font-face\s*{[^}]*}/g, '')
    .replace(/font-family:\s*"lil-gui";/g, '');
  const sheet = new CSSStyleSheet();
  sheet.replaceSync(css);
  document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
}
