// The one module that touches IndexedDB (through idb-keyval). It owns the store names, and it saves
// plain copies: IndexedDB cannot hold Vue proxies, and iOS Safari cannot hold Blobs (photos are kept
// as { bytes: ArrayBuffer, type }).
import { createStore, del, delMany, entries, get, set, setMany, type UseStore } from 'idb-keyval'

const names = {
  outbox: ['tamp-outbox', 'entries'],
  photos: ['tamp-photos', 'bytes'],
  records: ['tamp-records', 'records'],
  meta: ['tamp-meta', 'meta'],
  /** What a form holds as it is typed, until it is saved to the outbox (useDraft). */
  drafts: ['tamp-drafts', 'drafts'],
} as const
export type StoreName = keyof typeof names

const opened = new Map<StoreName, UseStore>()

// Opened on first use: there is no IndexedDB during server rendering.
function store(name: StoreName): UseStore {
  let handle = opened.get(name)
  if (!handle) {
    handle = createStore(names[name][0], names[name][1])
    opened.set(name, handle)
  }
  return handle
}

/** A structured-cloneable copy of plain data that may sit inside reactive state. */
export function plain<T>(value: T): T {
  return value === undefined ? value : JSON.parse(JSON.stringify(value)) as T
}

const fullListeners = new Set<() => void>()

/** Calls `listener` whenever a write fails because the phone is out of space; answers how to stop. */
export function onStorageFull(listener: () => void): () => void {
  fullListeners.add(listener)
  return () => fullListeners.delete(listener)
}

/** A write, with a full quota told to the listeners (the crew lead must hear of it) before it fails. */
async function written(write: Promise<void>): Promise<void> {
  try {
    await write
  }
  catch (error) {
    if ((error as { name?: string } | null)?.name === 'QuotaExceededError') for (const listener of fullListeners) listener()
    throw error
  }
}

export const idb = {
  get: <T>(name: StoreName, key: string) => get<T>(key, store(name)),
  put: (name: StoreName, key: string, value: unknown) => written(set(key, value instanceof ArrayBuffer ? value : plain(value), store(name))),
  putMany: (name: StoreName, items: [string, unknown][]) => written(setMany(items.map(([k, v]) => [k, plain(v)]), store(name))),
  /** For photos: the bytes are stored as they are (an ArrayBuffer is cloneable, a proxy is not). */
  putPhoto: (key: string, photo: { bytes: ArrayBuffer, type: string }) => written(set(key, { bytes: photo.bytes, type: photo.type }, store('photos'))),
  remove: (name: StoreName, key: string) => del(key, store(name)),
  removeMany: (name: StoreName, keys: string[]) => delMany(keys, store(name)),
  all: <T>(name: StoreName) => entries<string, T>(store(name)),
}

/** Asks the browser not to evict the outbox under storage pressure (ignored where unsupported). */
export async function askPersistentStorage(): Promise<boolean> {
  try {
    return await navigator.storage?.persist?.() ?? false
  }
  catch {
    return false
  }
}
