/**
 * Where the offline queue keeps its writes: IndexedDB (survives a reload, a crash and a flat
 * battery), or memory where the browser has none (component tests). One object store keyed by
 * the write's key; the order is the entry's `seq`.
 */
import { openDB, type IDBPDatabase } from 'idb'
import type { FloorWrite } from '@/services/floorApi'

export type QueueState = 'waiting' | 'sending' | 'refused'

export interface QueuedWrite {
  /** The write's clientId (or a fresh UUID for writes that carry several). */
  key: string
  /** Order of saving: writes are sent oldest first, so a section goes before its readings. */
  seq: number
  write: FloorWrite
  /** What the operator sees in the list, in their own units at the time of saving. */
  label: string
  /** Only the person who recorded a write may send it: the server attributes it to the token's user. */
  userId: number
  userName: string
  partId: number | null
  lotId: number | null
  createdAt: string
  attempts: number
  /** Epoch ms before which the write is not retried (backoff). */
  nextAttemptAt: number
  state: QueueState
  error: { status: number; code: string; message: string } | null
}

export interface QueueStorage {
  readonly persistent: boolean
  all(): Promise<QueuedWrite[]>
  put(entry: QueuedWrite): Promise<void>
  remove(key: string): Promise<void>
}

const DB_NAME = 'filmtrail-tablet'
const STORE = 'writes'

export function memoryStorage(): QueueStorage {
  const map = new Map<string, QueuedWrite>()
  return {
    persistent: false,
    all: async () => [...map.values()],
    put: async (e) => void map.set(e.key, e),
    remove: async (key) => void map.delete(key),
  }
}

export function indexedDbStorage(): QueueStorage | null {
  if (typeof indexedDB === 'undefined') return null
  let db: Promise<IDBPDatabase> | null = null
  const open = () =>
    (db ??= openDB(DB_NAME, 1, {
      upgrade(d) {
        if (!d.objectStoreNames.contains(STORE)) d.createObjectStore(STORE, { keyPath: 'key' })
      },
    }))
  return {
    persistent: true,
    all: async () => (await (await open()).getAll(STORE)) as QueuedWrite[],
    put: async (e) => void (await (await open()).put(STORE, e)),
    remove: async (key) => void (await (await open()).delete(STORE, key)),
  }
}

/** IndexedDB when it opens; memory otherwise (and the screen says records will not survive a reload). */
export async function openQueueStorage(): Promise<QueueStorage> {
  const idb = indexedDbStorage()
  if (idb) {
    try {
      await idb.all()
      return idb
    } catch {
      // Private mode or a blocked database: keep working in memory rather than refuse to record.
    }
  }
  return memoryStorage()
}
