// Text cells of exported CSV files, guarded against formula injection (OWASP "CSV Injection"): a cell that a
// spreadsheet would run as a formula (starting with = + - @, tab or carriage return) is written with a leading
// apostrophe, which spreadsheets show as text. The import reads such a cell back without the apostrophe, so an
// export still imports as it was.

const FORMULA_START = /^[=+\-@\t\r]/
/** A formula start behind apostrophes: escaped once more, so a value typed that way also comes back as it was. */
const GUARDED_FORMULA = /^'+[=+\-@\t\r]/

/** A text value as it is written into an exported CSV cell. */
export function csvTextCell(value: string): string {
  return FORMULA_START.test(value) || GUARDED_FORMULA.test(value) ? `'${value}` : value
}

/** A CSV cell as read by an import: the apostrophe `csvTextCell` added is dropped again. */
export function csvCellValue(cell: string): string {
  return GUARDED_FORMULA.test(cell) ? cell.slice(1) : cell
}
