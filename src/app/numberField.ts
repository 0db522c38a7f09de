// Number fields in the parameter panel refuse text that is not a plain decimal number ("abc",
// "12,5", "1.5abc"), where lil-gui would silently read the leading digits or ignore it: the value from
// before the edit comes back and the refusal is shown with the field named.

import type { Controller } from 'lil-gui';

/** Plain decimals, as the command line reads numeric options. */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

export const isDecimalText = (text: string): boolean => DECIMAL.test(text.trim());

/** Watch a number controller's text box; `refuse` gets the text after lil-gui has finished with it. */
export function guardNumber(c: Controller, refuse: (text: string) => void): Controller {
  const input = (c as unknown as { $input?: unknown }).$input;
  if (!(input instanceof HTMLInputElement)) return c;
  let before: unknown = c.getValue();
  input.addEventListener('focus', () => { before = c.getValue(); });
  input.addEventListener('change', () => {
    const text = input.value;
    if (isDecimalText(text)) return;
    // lil-gui may have applied a leading number while typing ("12" of "12,5"): undo that.
    if (c.getValue() !== before) c.setValue(before);
    // After lil-gui's own blur handling, which would otherwise clear or replace the message.
    setTimeout(() => refuse(text), 0);
  });
  return c;
}
