import type { H3Event } from 'h3'
import type { z } from 'zod'
import { fieldErrorsOf } from '../../shared/utils/field-errors'

/** 422 with the field errors a form shows beside its inputs. */
export function invalidInput(error: z.ZodError, statusMessage = 'Some fields need a look'): Error {
  return createError({ statusCode: 422, statusMessage, data: { fieldErrors: fieldErrorsOf(error) } })
}

export async function readBodyWith<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  const result = await readValidatedBody(event, body => schema.safeParse(body ?? {}))
  if (!result.success) throw invalidInput(result.error)
  return result.data
}

export async function paramsWith<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  const result = await getValidatedRouterParams(event, params => schema.safeParse(params))
  // A malformed id cannot name any record: answer as for a record that does not exist.
  if (!result.success) throw createError({ statusCode: 404, statusMessage: 'Not found' })
  return result.data
}

export async function queryWith<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  const result = await getValidatedQuery(event, query => schema.safeParse(query))
  if (!result.success) throw invalidInput(result.error)
  return result.data
}
