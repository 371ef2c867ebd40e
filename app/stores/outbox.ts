// What waits on this phone, and the sender that empties it. The page drives sending: on load, when the
// connection returns, when the app becomes visible, after each save, on a timer and on "Send now".
import { skipHydrate } from 'pinia'
import { OutboxEngine } from '~/utils/outbox-engine'
import type { OutboxEntry, OutboxProgress, OutboxStatus, PhotoMeta } from '~/utils/outbox-types'
import { exclusively, uploadWithProgress } from '~/utils/photo-shrink'
import type { SyncKind } from '~~/shared/schemas/daybook'

const timerMs = 30_000

export const useOutboxStore = defineStore('outbox', () => {
  const entries = ref<OutboxEntry[]>([])
  const status = ref<OutboxStatus>('idle')
  /** The connection as the browser reports it, kept current by its online and offline events. */
  const online = ref(true)
  const progress = ref<OutboxProgress>({ records: { done: 0, total: 0 }, bytes: { done: 0, total: 0 } })
  const session = useUserSession()
  let engine: OutboxEngine | undefined
  let started = false
  let refreshTimer: ReturnType<typeof setTimeout> | undefined

  function use(): OutboxEngine {
    engine ??= new OutboxEngine({
      fetch: (url, init) => fetch(url, { ...init, credentials: 'same-origin' }),
      upload: uploadWithProgress,
      userId: () => session.user.value?.id,
      online: () => navigator.onLine,
      exclusive: exclusively,
      changed: () => {
        clearTimeout(refreshTimer)
        refreshTimer = setTimeout(refresh, 50)
      },
    })
    return engine
  }

  async function refresh(): Promise<void> {
    const e = use()
    entries.value = await e.entries()
    status.value = e.status
    progress.value = structuredClone(e.progress)
    await useDaybookStore().reloadRecords()
  }

  async function sendNow(): Promise<void> {
    await use().run()
    // The engine's own status: the store's copy is refreshed 50 ms later and would still say 'sending'.
    if (use().status === 'idle') await useDaybookStore().refreshFromServer()
  }

  /** Starts the triggers once per page load. */
  function start(): void {
    if (started || import.meta.server) return
    started = true
    online.value = navigator.onLine
    window.addEventListener('online', () => {
      online.value = true
      void sendNow()
    })
    window.addEventListener('offline', () => {
      online.value = false
      void refresh().then(() => { status.value = 'offline' })
    })
    document.addEventListener('visibilitychange', () => {
      if (document.visibilityState === 'visible') void refresh().then(sendNow)
    })
    setInterval(() => void sendNow(), timerMs)
    void refresh().then(sendNow)
  }

  async function saveRecord(kind: SyncKind, record: Record<string, unknown> & { id: string }, op: 'upsert' | 'delete', label: string) {
    await use().saveRecord(kind, record, op, label)
    await refresh()
    void sendNow()
  }

  async function savePhoto(id: string, bytes: ArrayBuffer, meta: PhotoMeta, label: string) {
    await use().savePhoto(id, bytes, meta, label)
    await refresh()
    void sendNow()
  }

  const act = (name: 'keepMine' | 'takeServer' | 'retry' | 'discard') => async (key: string) => {
    await use()[name](key)
    await refresh()
    if (name !== 'discard' && name !== 'takeServer') void sendNow()
  }

  const waitingCount = computed(() => entries.value.length)
  const stateOf = (key: string) => entries.value.find(e => e.key === key)?.state

  return {
    entries: skipHydrate(entries), status: skipHydrate(status), online: skipHydrate(online), progress: skipHydrate(progress), waitingCount,
    start, refresh, sendNow, saveRecord, savePhoto, stateOf,
    keepMine: act('keepMine'), takeServer: act('takeServer'), retry: act('retry'), discard: act('discard'),
  }
})
