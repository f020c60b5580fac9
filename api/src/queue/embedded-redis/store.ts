// State the layer keeps beside ioredis-mock's shared data, one per mock context (the mock
// shares data between instances created with the same host:port/db).
import { EventEmitter } from 'node:events';

export interface StreamEntry {
  ms: number;
  seq: number;
  id: string;
  fields: Array<string | Buffer>;
}

export interface StreamState {
  /** Identifies the marker object stored under the key in the mock's data. */
  token: number;
  entries: StreamEntry[];
  lastMs: number;
  lastSeq: number;
}

/** What a connection exposes to CLIENT LIST. */
export interface ClientInfo {
  id: number;
  name: string;
  createdAt: number;
}

export interface EmbeddedStore {
  streams: Map<string, StreamState>;
  clients: Set<ClientInfo>;
  /** Fires `stream:<key>` after XADD; blocked XREAD readers listen. */
  events: EventEmitter;
  nextClientId: number;
  nextStreamToken: number;
}

/** The pieces of an ioredis-mock context this layer uses. */
export interface MockContext {
  data: { clear(): void };
  expires: { clear(): void };
  modifiedKeyEvents: EventEmitter;
}

const stores = new Map<MockContext, EmbeddedStore>();

export function storeFor(context: MockContext): EmbeddedStore {
  let store = stores.get(context);
  if (!store) {
    const events = new EventEmitter();
    events.setMaxListeners(0);
    context.modifiedKeyEvents.setMaxListeners(0);
    store = { streams: new Map(), clients: new Set(), events, nextClientId: 1, nextStreamToken: 1 };
    stores.set(context, store);
  }
  return store;
}

/** Empties every embedded data set (keys, expiries, streams); connections stay open. */
export function clearAllStores(): void {
  for (const [context, store] of stores) {
    context.data.clear();
    context.expires.clear();
    store.streams.clear();
  }
}
