// A spreadsheet opening a CSV runs any cell that starts like a formula (OWASP "CSV injection"):
// a recipe named "=HYPERLINK(...)" would become a live link. Exports put an apostrophe before
// such text, as spreadsheets themselves do; imports take it off again, so a file round-trips.
// Plain numbers, negative ones included, are left alone. Text that already starts with
// apostrophes before such a character gets one more, so unescaping never changes real text.
export const FORMULA_START = /^'*(?:[=+@\t\r]|-(?!\d+(?:\.\d+)?$))/;

/** The cell as exported: an apostrophe before text a spreadsheet would run. */
export function escapeFormula(cell: string): string {
  return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

/** The cell as it was before `escapeFormula`. */
export function unescapeFormula(cell: string): string {
  return cell.startsWith("'") && FORMULA_START.test(cell.slice(1)) ? cell.slice(1) : cell;
}
