import 'fake-indexeddb/auto'
import { IDBFactory } from 'fake-indexeddb'
import { beforeEach } from 'vitest'

// jsdom has no IndexedDB: the client project gets fake-indexeddb, a fresh, empty one per test.
// (A reload inside a test keeps the same one: a new Pinia over the same database.)
beforeEach(() => {
  globalThis.indexedDB = new IDBFactory()
})
