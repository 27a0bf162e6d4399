// An in-memory IndexedDB, just what the window's capture memory uses, with the failures a browser can show: open
// throws, writes abort (a full quota), or nothing ever answers. Requests answer on a later task; a transaction
// commits when none is left pending, and an aborted one leaves nothing behind.

type Key = IDBValidKey;
type Stores = Map<string, Map<Key, unknown>>;

export type Failure = 'none' | 'throws' | 'quota' | 'silent';

class FakeRequest<T = unknown> {
  result!: T;
  error: unknown = null;
  transaction: FakeTransaction | null = null;
  onsuccess: ((event: unknown) => void) | null = null;
  onerror: ((event: unknown) => void) | null = null;
  onupgradeneeded: ((event: { oldVersion: number }) => void) | null = null;
  onblocked: (() => void) | null = null;
}

class FakeStore {
  constructor(
    private readonly tx: FakeTransaction,
    private readonly name: string,
  ) {}

  private get data(): Map<Key, unknown> {
    const data = this.tx.stores.get(this.name);
    if (!data) throw new Error(`no store ${this.name}`);
    return data;
  }

  get(key: Key) {
    return this.tx.request(() => structuredClone(this.data.get(key)));
  }

  getAllKeys() {
    return this.tx.request(() => [...this.data.keys()]);
  }

  put(value: unknown, key: Key) {
    this.tx.writing();
    return this.tx.request(() => void this.data.set(key, structuredClone(value)));
  }

  delete(key: Key) {
    this.tx.writing();
    return this.tx.request(() => void this.data.delete(key));
  }
}

class FakeTransaction {
  oncomplete: (() => void) | null = null;
  onabort: (() => void) | null = null;
  onerror: (() => void) | null = null;
  error: unknown = null;
  private pending = 0;
  private ended = false;
  private wrote = false;

  constructor(
    readonly stores: Stores,
    private readonly commit: (stores: Stores) => void,
    private readonly quota: boolean,
  ) {
    this.settleLater();
  }

  objectStore(name: string) {
    return new FakeStore(this, name);
  }

  writing() {
    this.wrote = true;
  }

  request<T>(run: () => T): FakeRequest<T> {
    if (this.ended) throw new Error('TransactionInactiveError');
    const request = new FakeRequest<T>();
    this.pending++;
    setTimeout(() => {
      this.pending--;
      if (this.ended) return;
      request.result = run();
      request.onsuccess?.({});
      this.settleLater();
    });
    return request;
  }

  abort() {
    if (this.ended) throw new Error('InvalidStateError');
    this.ended = true;
    setTimeout(() => this.onabort?.());
  }

  private settleLater() {
    setTimeout(() => {
      if (this.ended || this.pending > 0) return;
      this.ended = true;
      if (this.quota && this.wrote) {
        this.error = Object.assign(new Error('the quota is full'), { name: 'QuotaExceededError' });
        this.onabort?.();
        return;
      }
      this.commit(this.stores);
      this.oncomplete?.();
    });
  }
}

function copy(stores: Stores): Stores {
  return new Map([...stores].map(([name, data]) => [name, new Map(data)]));
}

/** The databases, inspectable by the test, and the `indexedDB` global over them. */
export class FakeIndexedDb {
  readonly databases = new Map<string, { version: number; stores: Stores }>();
  failure: Failure = 'none';
  /** How many connections are open now. */
  open = 0;

  store(db: string, name: string): Map<Key, unknown> {
    const data = this.databases.get(db)?.stores.get(name);
    if (!data) throw new Error(`no store ${db}/${name}`);
    return data;
  }

  readonly factory = {
    open: (name: string, version = 1) => {
      if (this.failure === 'throws') throw new Error('IndexedDB is off in this window');
      const request = new FakeRequest<unknown>();
      if (this.failure === 'silent') return request;
      setTimeout(() => {
        const existing = this.databases.get(name);
        const db = existing ?? { version: 0, stores: new Map() };
        const connect = () => {
          this.open++;
          request.result = this.connection(db);
          request.onsuccess?.({});
        };
        if (db.version >= version) return connect();
        // The upgrade works on the stores in place, then the connection opens.
        const oldVersion = db.version;
        db.version = version;
        this.databases.set(name, db);
        const tx = new FakeTransaction(db.stores, () => undefined, false);
        request.result = this.connection(db, tx);
        request.transaction = tx;
        tx.oncomplete = () => {
          request.transaction = null;
          this.open++;
          request.onsuccess?.({});
        };
        request.onupgradeneeded?.({ oldVersion });
      });
      return request;
    },
    deleteDatabase: (name: string) => {
      this.databases.delete(name);
      return new FakeRequest();
    },
  };

  /** A connection; during an upgrade, `upgrade` is its transaction (the stores it makes are answered from it). */
  private connection(db: { stores: Stores }, upgrade?: FakeTransaction) {
    return {
      createObjectStore: (store: string) => {
        db.stores.set(store, new Map());
        return upgrade?.objectStore(store);
      },
      deleteObjectStore: (store: string) => void db.stores.delete(store),
      transaction: (names: string | string[], mode: IDBTransactionMode) => {
        for (const store of [names].flat()) if (!db.stores.has(store)) throw new Error(`NotFoundError: no store ${store}`);
        return new FakeTransaction(copy(db.stores), (done) => mode === 'readwrite' && (db.stores = done), this.failure === 'quota');
      },
      close: () => void this.open--,
    };
  }
}

/** A localStorage over a map. */
export function fakeLocalStorage(): Storage {
  const items = new Map<string, string>();
  return {
    get length() {
      return items.size;
    },
    clear: () => items.clear(),
    getItem: (key) => items.get(key) ?? null,
    key: (index) => [...items.keys()][index] ?? null,
    removeItem: (key) => void items.delete(key),
    setItem: (key, value) => void items.set(key, value),
  };
}
