// Decoding and resizing a 12-megapixel photo takes some 100 MB, so only a few run at once. The queue
// in front of them is bounded too: past it the phone is told to come back later (503 with
// Retry-After, on which its outbox backs off), and a phone that gives up while waiting leaves the
// queue at once, never to be handed a slot.

export interface SlotLoad { decoding: number, waiting: number }

export class SlotQueue {
  private busy = 0
  private waiters: { grant: () => void }[] = []

  constructor(private readonly slots: number, private readonly maxWaiting: number) {}

  load(): SlotLoad {
    return { decoding: this.busy, waiting: this.waiters.length }
  }

  /** Runs `work` in a slot; rejects with `QueueFull` when too many wait, and with 400 when the signal aborts first. */
  async run<T>(work: () => Promise<T>, signal: AbortSignal): Promise<T> {
    await this.acquire(signal)
    try {
      return await work()
    }
    finally {
      this.release()
    }
  }

  private acquire(signal: AbortSignal): Promise<void> {
    if (signal.aborted) return Promise.reject(gaveUp())
    if (this.busy < this.slots) {
      this.busy++
      return Promise.resolve()
    }
    if (this.waiters.length >= this.maxWaiting) {
      return Promise.reject(new QueueFull())
    }
    return new Promise<void>((resolve, reject) => {
      const waiter = {
        grant: () => {
          signal.removeEventListener('abort', leave)
          this.busy++
          resolve()
        },
      }
      const leave = () => {
        this.waiters = this.waiters.filter(w => w !== waiter)
        reject(gaveUp())
      }
      signal.addEventListener('abort', leave, { once: true })
      this.waiters.push(waiter)
    })
  }

  private release(): void {
    this.busy--
    this.waiters.shift()?.grant()
  }
}

export class QueueFull extends Error {
  constructor() {
    super('Too many photos wait for a decode slot')
  }
}

const gaveUp = () => createError({ statusCode: 400, statusMessage: 'The phone stopped waiting for this photo' })
