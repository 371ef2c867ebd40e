// CSV for spreadsheets, written by csv-stringify (never by string concatenation). A cell that starts
// with = + - @ tab or CR would be run as a formula by Excel, LibreOffice or Sheets (OWASP, "CSV
// Injection"): such text gets a leading apostrophe. Numbers stay numbers, so -2.5 is not touched.
import { stringify } from 'csv-stringify/sync'
import { setResponseHeaders, type H3Event } from 'h3'

export type CsvCell = string | number | boolean | null | undefined

const formulaStart = /^[=+\-@\t\r]/

export function neutraliseCell(value: CsvCell): string | number | boolean | null {
  if (value === undefined) return null
  if (typeof value === 'string' && formulaStart.test(value)) return `'${value}`
  return value
}

/** A header row then one row per record; CRLF line ends as RFC 4180 asks. */
export function toCsv(header: string[], rows: CsvCell[][]): string {
  return stringify([header, ...rows.map(row => row.map(neutraliseCell))], { record_delimiter: 'windows', cast: { boolean: value => (value ? 'yes' : 'no') } })
}

/** Answers with a CSV download named `filename`. */
export function sendCsv(event: H3Event, filename: string, csv: string): string {
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${filename.replace(/[^\w.-]/g, '_')}"`,
    'cache-control': 'no-store',
  })
  return csv
}
