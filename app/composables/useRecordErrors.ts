import type { z } from 'zod'
import { fieldErrorsOf } from '~~/shared/utils/field-errors'
import type { RecordKind } from '~~/shared/schemas/daybook'

/**
 * Field errors of a daybook form, in the user's language where a translation exists (errors.<kind>.<field>),
 * with the first wrong field brought into view.
 */
export function useRecordErrors(kind: RecordKind, root: Ref<HTMLElement | undefined>) {
  const { t, te } = useI18n()
  const errors = ref<Record<string, string>>({})
  const formError = ref('')

  /** A rule across fields (finish after start) has a message of its own (errors.<kind>.<rule>); others, the field's. */
  function translated(key: string, message: string, rule: string | undefined): string {
    if (rule && te(`errors.${kind}.${rule}`)) return t(`errors.${kind}.${rule}`)
    return te(`errors.${kind}.${key}`) ? t(`errors.${kind}.${key}`) : message
  }

  function show(error: z.ZodError, fallback = ''): void {
    const { _form, ...found } = fieldErrorsOf(error)
    const rules = Object.fromEntries(error.issues.map(issue => [issue.path.join('.'), issue.code === 'custom' ? (issue.params as { rule?: string } | undefined)?.rule : undefined]))
    errors.value = Object.fromEntries(Object.entries(found).map(([key, message]) => [key, translated(key, message, rules[key])]))
    formError.value = _form ?? fallback
    focusFirst()
  }

  /** Brings the first field marked invalid into view (without the browser's own scroll, which can leave it under the sticky bar). */
  function focusFirst(): void {
    nextTick(() => {
      const field = root.value?.querySelector<HTMLElement>('[aria-invalid="true"]')
      field?.focus({ preventScroll: true })
      field?.scrollIntoView({ block: 'center' })
    })
  }

  return { errors, formError, show, focusFirst }
}
