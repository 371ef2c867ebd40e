// The Plan screen's typed fields read in one go: measures through parseMeasure (fractions,
// feet-and-inches, thousands), plain numbers through parseNumber. A field with a typing error is
// named in the error, so PlanCalcError can say which box to fix.
import { isMeasureError, parseMeasure, parseNumber, type MeasureUnit } from '~~/shared/utils/planning-measure'

export type FieldKind = MeasureUnit | 'number'

export interface ReadFields<K extends string> {
  /** Every field's value, once none is blank or wrong. */
  values?: Record<K, number>
  /** The first typing error, with the field's name on it. */
  error?: unknown
}

/** Read each field; blank fields leave `values` out (the screen asks to fill in), bad ones give `error`. */
export function readFields<K extends string>(fields: Record<K, [text: string, kind: FieldKind]>): ReadFields<K> {
  const values = {} as Record<K, number>
  let blank = false
  for (const key of Object.keys(fields) as K[]) {
    const [text, kind] = fields[key]
    if (text.trim() === '') {
      blank = true
      continue
    }
    try {
      values[key] = kind === 'number' ? parseNumber(text) : parseMeasure(text, kind)
    }
    catch (error) {
      if (isMeasureError(error)) error.field = key
      return { error }
    }
  }
  return blank ? {} : { values }
}

/** One optional field: undefined when blank or unreadable (for cautions, which must not hide). */
export function readOptional(text: string, kind: FieldKind): number | undefined {
  const read = readFields({ value: [text, kind] })
  return read.values?.value
}
