// Warnings of a study, counted over its cases instead of repeated per case: each message once, with the number of
// cases that gave it and the first of them. Listed in order of first appearance (cases in order, a case's warnings
// in its own order), so a study run in shards and merged lists them exactly as one run does.

export interface TalliedWarning { message: string; cases: number; first_case: number }

export class WarningTally {
  private readonly byMessage = new Map<string, TalliedWarning>();

  /** The warnings of one case (cases must come in increasing order). */
  add(caseIndex: number, messages: readonly string[]): void {
    for (const message of new Set(messages)) {
      const w = this.byMessage.get(message);
      if (w) w.cases++;
      else this.byMessage.set(message, { message, cases: 1, first_case: caseIndex });
    }
  }

  /** Another tally's list, of later cases. */
  merge(list: readonly TalliedWarning[]): void {
    for (const t of list) {
      const w = this.byMessage.get(t.message);
      if (w) w.cases += t.cases;
      else this.byMessage.set(t.message, { ...t });
    }
  }

  list(): TalliedWarning[] { return [...this.byMessage.values()].map((w) => ({ ...w })); }
}
