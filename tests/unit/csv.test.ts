// CSV exports: RFC 4180 quoting (by csv-stringify) and the OWASP "CSV Injection" advice that a cell
// beginning with = + - @ tab or carriage return is prefixed with an apostrophe.
import { describe, expect, it } from 'vitest'
import { neutraliseCell, toCsv } from '../../server/utils/csv'

describe('toCsv', () => {
  it('writes the header then the rows, with CRLF line ends', () => {
    expect(toCsv(['job', 'crew-days'], [['Maple walk', 4.5]])).toBe('job,crew-days\r\nMaple walk,4.5\r\n')
  })

  it('quotes commas, quotes and line breaks so a spreadsheet keeps one cell', () => {
    expect(toCsv(['note'], [['base, then "bedding"\nsand']])).toBe('note\r\n"base, then ""bedding""\nsand"\r\n')
  })

  it.each(['=HYPERLINK("http://x.test")', '+1 555 0100', '-2+3', '@SUM(A1)', '\tcmd', '\rcmd'])('a customer entry starting like a formula (%j) cannot run in a spreadsheet', (value) => {
    const csv = toCsv(['customer'], [[value]])
    const cell = csv.split('\r\n')[1] ?? ''
    expect(cell.replace(/^"/, '').startsWith('\'')).toBe(true)
    expect(neutraliseCell(value)).toBe(`'${value}`)
  })

  it('leaves numbers, empty cells and yes/no as they are', () => {
    expect(toCsv(['a', 'b', 'c', 'd'], [[-2.5, null, undefined, true]])).toBe('a,b,c,d\r\n-2.5,,,yes\r\n')
  })
})
