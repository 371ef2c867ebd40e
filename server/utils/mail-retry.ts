// How long a failed message waits before the mail outbox tries it again. Pure, so it is tested alone.

/** Wait before the next try: the interval, doubled at each failure, at most an hour. */
export function retryDelayMs(attempts: number, intervalSeconds: number): number {
  return Math.min(3_600_000, Math.max(1, intervalSeconds) * 1000 * 2 ** Math.max(0, attempts - 1))
}
