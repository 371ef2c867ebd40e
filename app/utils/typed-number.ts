/**
 * A number as typed into a field: undefined when the field is blank, NaN when it is not a number
 * (the schema then says so). Commas group thousands (1,200 is 1200, 12,500.5 is 12500.5), as in
 * US English and US Spanish; a lone comma before one or two digits is still read as the decimal
 * comma a Spanish keyboard types (2,5 is 2.5). Any other comma is not guessed at: NaN.
 * Measures on the Plan screen go through parseMeasure, which also reads fractions and feet-inches.
 */
export function typedNumber(value: string): number | undefined {
  const text = value.trim()
  if (text === '') return undefined
  if (/^-?[1-9]\d{0,2}(?:,\d{3})+(?:\.\d+)?$/.test(text)) return Number(text.replace(/,/g, ''))
  if (/^-?\d+,\d{1,2}$/.test(text)) return Number(text.replace(',', '.'))
  return text.includes(',') ? Number.NaN : Number(text)
}
