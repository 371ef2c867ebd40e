import type { H3Event } from 'h3'

// Failed sign-ins are counted in MariaDB, so every app instance sees the same count.
const windowMinutes = 15
export const throttleLimits = { perAccount: 5, perAddress: 50 }

async function failuresSince(column: 'email' | 'ip', value: string): Promise<{ count: number, oldest: Date | null }> {
  const row = await useDb()('sign_in_attempts')
    .where(column, value)
    .andWhereRaw('created_at > NOW(3) - INTERVAL ? MINUTE', [windowMinutes])
    .first(useDb().raw('COUNT(*) AS count'), useDb().raw('MIN(created_at) AS oldest'))
  return { count: Number(row?.count ?? 0), oldest: row?.oldest ?? null }
}

/** 429 with Retry-After once an account (or an address) has used up its failed attempts. */
export async function assertNotThrottled(event: H3Event, email: string, ip: string): Promise<void> {
  for (const [column, value, limit] of [['email', email, throttleLimits.perAccount], ['ip', ip, throttleLimits.perAddress]] as const) {
    const { count, oldest } = await failuresSince(column, value)
    if (count >= limit && oldest) {
      const retryAfter = Math.max(1, Math.ceil((oldest.getTime() + windowMinutes * 60_000 - Date.now()) / 1000))
      setResponseHeader(event, 'Retry-After', retryAfter)
      throw createError({
        statusCode: 429,
        statusMessage: 'Too many failed sign-ins; wait before trying again',
        data: { retryAfterSeconds: retryAfter },
      })
    }
  }
}

export async function recordFailedSignIn(email: string, ip: string): Promise<void> {
  await useDb()('sign_in_attempts').insert({ email, ip })
}

export async function clearFailedSignIns(email: string): Promise<void> {
  await useDb()('sign_in_attempts').where({ email }).delete()
}
