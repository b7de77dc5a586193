// The one unsaved run kept in IndexedDB (a single key, so only the latest is ever kept).
import type { StoredRun } from './unsaved-run';
import type { StoredVectorRun } from './vector-run';

const DB_NAME = 'anglebench-bench';
const STORE = 'unsaved-run';
const KEY = 'latest';

function openDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    if (typeof indexedDB === 'undefined') return reject(new Error('this browser keeps no local data (no IndexedDB)'));
    const req = indexedDB.open(DB_NAME, 1);
    req.onupgradeneeded = () => req.result.createObjectStore(STORE);
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB would not open'));
  });
}

async function withStore<T>(mode: IDBTransactionMode, fn: (s: IDBObjectStore) => IDBRequest<T>): Promise<T> {
  const db = await openDb();
  try {
    return await new Promise<T>((resolve, reject) => {
      const tx = db.transaction(STORE, mode);
      const req = fn(tx.objectStore(STORE));
      tx.oncomplete = () => resolve(req.result);
      tx.onerror = () => reject(tx.error ?? new Error('IndexedDB transaction failed'));
      tx.onabort = () => reject(tx.error ?? new Error('IndexedDB transaction aborted (out of space?)'));
    });
  } finally {
    db.close();
  }
}

export const unsavedRunStore = {
  put: (run: StoredRun | StoredVectorRun) => withStore('readwrite', (s) => s.put(run, KEY)).then(() => undefined),
  get: () => withStore<unknown>('readonly', (s) => s.get(KEY)),
  clear: () => withStore('readwrite', (s) => s.delete(KEY)).then(() => undefined),
};

export type UnsavedRunStore = typeof unsavedRunStore;
