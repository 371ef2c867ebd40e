// The state every Tamp form needs: field errors beside the inputs, one message above the button,
// and a pending flag. The same zod schema the server validates with runs here first, and a 422 from
// the server lands in the same fieldErrors, so a form shows both the same way; messages Tamp knows
// (app/utils/form-messages.ts) show in the user's language.
import type { z } from 'zod'
import { fieldErrorsOf, type FieldErrors } from '~~/shared/utils/field-errors'

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null
}

function textOf(...values: unknown[]): string | undefined {
  for (const value of values) if (typeof value === 'string' && value) return value
  return undefined
}

/** Retry-After is either seconds or an HTTP date; either way, whole minutes, at least one. */
export function retryMinutes(header: string | null | undefined, now = Date.now()): number {
  if (!header) return 1
  const seconds = /^\d+$/.test(header.trim()) ? Number(header) : (Date.parse(header) - now) / 1000
  return Number.isFinite(seconds) ? Math.max(1, Math.ceil(seconds / 60)) : 1
}

interface ServerError {
  status?: number
  message?: string
  fieldErrors?: FieldErrors
  retryAfter?: string | null
}

/** What $fetch's FetchError carries, read without trusting its shape. */
export function readServerError(error: unknown): ServerError {
  if (!isRecord(error)) return {}
  const body = isRecord(error.data) ? error.data : {}
  const data = isRecord(body.data) ? body.data : {}
  const response = isRecord(error.response) ? error.response : {}
  const status = typeof error.statusCode === 'number' ? error.statusCode : typeof response.status === 'number' ? response.status : undefined
  const fieldErrors: FieldErrors = {}
  if (isRecord(data.fieldErrors)) {
    for (const [key, value] of Object.entries(data.fieldErrors)) if (typeof value === 'string') fieldErrors[key] = value
  }
  const headers = response.headers
  const retryAfter = typeof Headers !== 'undefined' && headers instanceof Headers ? headers.get('retry-after') : undefined
  return { status, message: textOf(body.statusMessage, body.statusText, body.message), fieldErrors, retryAfter }
}

/** `status` is the HTTP status of a failed write; absent when the server was not reached. */
export type SubmitResult<T> = { ok: true, data: T } | { ok: false, status?: number }

export function useApiForm() {
  const { t } = useI18n()
  const fieldErrors = ref<FieldErrors>({})
  const formError = ref('')
  const pending = ref(false)

  function translated(message: string): string {
    const known = formMessageKey(message)
    return known ? t(known.key, { n: known.n ?? '' }) : message
  }

  function translatedAll(errors: FieldErrors): FieldErrors {
    return Object.fromEntries(Object.entries(errors).map(([key, message]) => [key, translated(message)]))
  }

  function reset() {
    fieldErrors.value = {}
    formError.value = ''
  }

  // On a phone the first wrong field may be off screen: move focus to it.
  function focusFirstError() {
    if (!import.meta.client) return
    nextTick(() => document.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus())
  }

  /** Checks the values with the shared schema; returns the parsed (trimmed, lower-cased…) values or undefined. */
  function validate<S extends z.ZodType>(schema: S, values: unknown): z.output<S> | undefined {
    reset()
    const result = schema.safeParse(values)
    if (result.success) return result.data
    const { _form, ...errors } = fieldErrorsOf(result.error)
    fieldErrors.value = translatedAll(errors)
    if (_form) formError.value = translated(_form)
    focusFirstError()
    return undefined
  }

  function showError(error: unknown): number | undefined {
    const { status, message, fieldErrors: fromServer, retryAfter } = readServerError(error)
    if (status === 422 && fromServer && Object.keys(fromServer).length) {
      const { _form, ...errors } = fromServer
      fieldErrors.value = translatedAll(errors)
      if (_form) formError.value = translated(_form)
      focusFirstError()
    }
    else if (status === 429) {
      formError.value = t('formError.tooMany', retryMinutes(retryAfter))
    }
    else if (status === undefined) formError.value = t('formError.unreachable')
    else formError.value = message ? translated(message) : t('formError.failed')
    return status
  }

  /**
   * Runs one write. `ok: false` when it failed (the errors are then shown) or another is still
   * running; a route that answers with no body still gives `ok: true`.
   */
  async function submit<T>(fn: () => Promise<T>): Promise<SubmitResult<T>> {
    if (pending.value) return { ok: false }
    reset()
    pending.value = true
    try {
      return { ok: true, data: await fn() }
    }
    catch (error) {
      return { ok: false, status: showError(error) }
    }
    finally {
      pending.value = false
    }
  }

  return { fieldErrors, formError, pending, validate, submit, reset, showError, focusFirstError }
}
