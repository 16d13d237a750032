/**
 * The one way Pourline writes CSV. Every export goes through here so that text which a spreadsheet would
 * read as a formula (a cell starting with =, +, -, @, tab or carriage return) is neutralised with a leading
 * apostrophe — an operation named `=HYPERLINK(...)` must reach the spreadsheet as text, not as a live formula.
 * Numbers stay numbers: papaparse only applies the rule to string cells, so a negative figure is untouched.
 */
import Papa from "papaparse";

/**
 * Anchored at the start only: papaparse's own default (`/^[=+\-@\t\r].*$/`) lets a multi-line cell such as
 * "=1+1\nx" through, because `.` does not cross the newline.
 */
export const FORMULA_START = /^[=+\-@\t\r]/;

export function toCsv(rows: Record<string, unknown>[], options: { columns?: string[] } = {}): string {
  return Papa.unparse(rows, { ...options, escapeFormulae: FORMULA_START });
}
