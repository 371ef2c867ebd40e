/**
 * A number as typed into a field (a decimal comma read as a point, as Spanish keyboards type it):
 * undefined when the field is blank, NaN when it is not a number (the schema then says so).
 */
export function typedNumber(value: string): number | undefined {
  const text = value.trim()
  return text === '' ? undefined : Number(text.replace(',', '.'))
}
