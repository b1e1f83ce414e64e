// Aggregated, human-readable warnings: one line per kind of problem with the
// count and the span of file lines, e.g. "… (lines 40–52)".

/** Counts rows and remembers the lowest and highest row index seen. */
export class RowTally {
  count = 0;
  min = Infinity;
  max = -Infinity;

  add(row: number): void {
    this.count++;
    if (row < this.min) this.min = row;
    if (row > this.max) this.max = row;
  }
}

/** "(line 40)" or "(lines 40–52)", from the tally's rows mapped to file lines. */
export function linesOf(tally: RowTally, lineOf: (row: number) => number): string {
  const a = lineOf(tally.min);
  const b = lineOf(tally.max);
  return a === b ? `(line ${a})` : `(lines ${a}–${b})`;
}

/** "1 value was" / "3 values were": the count with a noun and its verb agreeing. */
export function counted(count: number, singular: string, plural: string, verbs: [string, string] = ['was', 'were']): string {
  return count === 1 ? `1 ${singular} ${verbs[0]}` : `${count} ${plural} ${verbs[1]}`;
}
