import { createStore, del, get, keys, set } from 'idb-keyval'

// One IndexedDB database for everything Jogwise keeps on the tablet: the event queue, run
// snapshots and photos waiting for the network. Browser only.
let store: ReturnType<typeof createStore> | undefined
const db = () => (store ??= createStore('jogwise', 'kv'))

export const localStore = {
  get: <T>(key: string) => get<T>(key, db()),
  set: (key: string, value: unknown) => set(key, value, db()),
  del: (key: string) => del(key, db()),
  keys: async () => (await keys(db())).map(String),
}
