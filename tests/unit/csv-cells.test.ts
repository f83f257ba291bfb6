import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { csvCellValue, csvTextCell } from '../../shared/csv-cells'

// OWASP "CSV Injection": cells starting with = + - @, tab or carriage return are run as formulas by
// spreadsheets; the usual defence is a leading apostrophe, which spreadsheets show as text.
describe('CSV text cells', () => {
  it.each(['=HYPERLINK("http://x.example","click")', '+1+1', '-2+3', '@SUM(A1)', '\tcmd', '\rcmd'])('guards %j', (value) => {
    expect(csvTextCell(value)).toBe(`'${value}`)
  })

  it.each(['Blue glass vase', '12 plates', 'a = b', '', '\'quoted already'])('leaves %j as it is', (value) => {
    expect(csvTextCell(value)).toBe(value)
  })

  it('reads back what it wrote, through a CSV round trip', () => {
    const values = ['=1+1', 'plain', '-chipped rim', '@home', '\'=kept', 'it\'s fine']
    const csv = Papa.unparse([values.map(csvTextCell)])
    const [row] = Papa.parse<string[]>(csv).data
    expect(row!.map(csvCellValue)).toEqual(values)
  })

  it('keeps an apostrophe the person typed before ordinary text', () => {
    expect(csvCellValue('\'70s lamp')).toBe('\'70s lamp')
  })
})
