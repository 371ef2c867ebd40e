import type { z } from 'zod'

/** Field name → first message, the shape every form shows beside its inputs. */
export type FieldErrors = Record<string, string>

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const errors: FieldErrors = {}
  for (const issue of error.issues) {
    const keys = issue.code === 'unrecognized_keys' ? issue.keys : [issue.path.join('.') || '_form']
    for (const key of keys) errors[key] ??= issue.code === 'unrecognized_keys' ? 'This field is not accepted' : issue.message
  }
  return errors
}
