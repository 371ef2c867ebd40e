// How long a failed day report or rain-out notice waits before the outbox tries it again.
import { describe, expect, it } from 'vitest'
import { retryDelayMs } from '../../server/utils/mail-retry'

describe('retryDelayMs', () => {
  it('waits one timer interval after the first failure and doubles after each further one', () => {
    expect([1, 2, 3, 4].map(attempts => retryDelayMs(attempts, 60))).toEqual([60_000, 120_000, 240_000, 480_000])
  })

  it('never waits more than an hour, so a relay back in the morning gets last night\'s reports', () => {
    expect(retryDelayMs(10, 60)).toBe(3_600_000)
    expect(retryDelayMs(40, 60)).toBe(3_600_000)
  })

  it('still waits a second when the timer is set to run every 0 seconds', () => {
    expect(retryDelayMs(1, 0)).toBe(1000)
  })
})
