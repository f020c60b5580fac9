// EmbeddedRedis: ioredis-mock plus what BullMQ needs from a Redis server. Overrides are
// installed as instance properties because the mock installs its commands that way.
import type { EventEmitter } from 'node:events';
import { createRequire } from 'node:module';
import type { Redis } from 'ioredis';
import { luaEngine } from './lua-engine.js';
import { StatusReply } from './lua-values.js';
import { createPipeline } from './pipeline.js';
import { storeFor, type ClientInfo, type EmbeddedStore, type MockContext } from './store.js';
import * as streams from './streams.js';

const require = createRequire(import.meta.url);

type Arg = string | Buffer;
type SyncCommand = (this: EmbeddedRedis, ...args: Arg[]) => unknown;
// The mock ships no types for its internals: the one we reach (Pipeline's command copier) is typed here.
interface RedisMockModule {
  new (options: Record<string, unknown>): object;
  Pipeline: { prototype: { copyCommands(this: object): void } };
}
const RedisMock = require('ioredis-mock') as RedisMockModule;

// The mock keeps its command emulators in a module-private table; its Pipeline copies them
// by name, which lets us collect the plain synchronous functions for use inside scripts.
const mockCommands: Record<string, SyncCommand> = (() => {
  const collector: Record<string, unknown> = {
    redis: { customCommands: {} },
    _createCommand: (_n: string, fn: SyncCommand) => fn,
  };
  RedisMock.Pipeline.prototype.copyCommands.call(collector);
  delete collector.redis;
  delete collector._createCommand;
  return collector as Record<string, SyncCommand>;
})();

/** Commands whose Redis reply is a status (+OK); scripts receive those as {ok=...}. */
const STATUS_COMMANDS = new Set([
  'set',
  'mset',
  'hmset',
  'rename',
  'ltrim',
  'lset',
  'flushdb',
  'flushall',
  'select',
  'setex',
  'psetex',
  'restore',
  'watch',
  'unwatch',
  'discard',
]);

export class ConnectionClosedError extends Error {
  constructor() {
    super('Connection is closed.');
  }
}

function toBufferReply(value: unknown): unknown {
  if (typeof value === 'string') return Buffer.from(value);
  if (Array.isArray(value)) return value.map(toBufferReply);
  return value;
}

// ioredis accepts nested arrays and numbers; Redis sees strings (Buffers pass through).
function flattenArgs(args: unknown[]): Arg[] {
  const out: Arg[] = [];
  for (const a of args) {
    if (Array.isArray(a)) for (const b of a) out.push(argToString(b));
    else out.push(argToString(a));
  }
  return out;
}
function argToString(a: unknown): Arg {
  if (a === null || a === undefined) return '';
  if (Buffer.isBuffer(a)) return a;
  if (a instanceof Uint8Array) return Buffer.from(a);
  // eslint-disable-next-line @typescript-eslint/no-base-to-string -- ioredis sends any other argument as String(arg)
  return String(a);
}

export interface EmbeddedRedisOptions {
  /** Connections with the same name share one data set (default "default"). */
  name?: string;
  /** Logical database number; each is a separate data set. */
  db?: number;
  /** Do not connect until connect() is called (like ioredis). */
  lazyConnect?: boolean;
  /** Passed through to the mock (connectionName etc.). */
  [key: string]: unknown;
}

interface Waiter {
  cancel(err: Error): void;
}

/** What this layer relies on from the mock's class (it is an EventEmitter). */
interface MockBase extends EventEmitter {
  disconnect(): void;
}
const MockClass = RedisMock as new (options: Record<string, unknown>) => MockBase;

export class EmbeddedRedis extends MockClass {
  declare status: string;
  /** Marks instances for isEmbeddedRedis(). */
  readonly isEmbeddedRedis = true;
  readonly store: EmbeddedStore;
  private readonly clientInfo: ClientInfo;
  private readonly waiters = new Set<Waiter>();

  constructor(options: EmbeddedRedisOptions = {}) {
    const { name, ...rest } = options;
    const host = typeof rest.host === 'string' ? rest.host : `embedded-${name ?? 'default'}`;
    super({ ...rest, host, port: typeof rest.port === 'number' ? rest.port : 6379 });
    const self = this as unknown as Record<string, unknown> & { context: MockContext };
    this.store = storeFor(self.context);
    this.clientInfo = { id: this.store.nextClientId++, name: '', createdAt: Date.now() };
    this.status = rest.lazyConnect ? 'wait' : 'ready';
    if (!rest.lazyConnect) this.store.clients.add(this.clientInfo);
    // The mock installs these as instance properties, which would shadow our methods.
    for (const own of ['defineCommand', 'connect', 'duplicate', 'pipeline', 'multi', 'disconnect']) delete self[own];
    for (const [cmd, impl] of Object.entries(OVERRIDES)) this.installCommand(cmd, impl);
    this.installCommand('bzpopmin', bzpopmin as unknown as SyncCommand);
    this.installCommand('xread', xread as unknown as SyncCommand);
  }

  private get mockData(): streams.StreamHost['data'] {
    return (this as unknown as { data: streams.StreamHost['data'] }).data;
  }

  private installCommand(cmd: string, impl: SyncCommand, lowerName = cmd): void {
    const self = this as unknown as Record<string, unknown>;
    const make =
      (asBuffer: boolean) =>
      (...raw: unknown[]) => {
        const callback =
          typeof raw[raw.length - 1] === 'function' ? (raw.pop() as (e: unknown, r?: unknown) => void) : undefined;
        const promise = new Promise<unknown>((resolve) => {
          if (this.status === 'end') throw new ConnectionClosedError();
          resolve(impl.apply(this, flattenArgs(raw)));
        }).then((r) => (asBuffer ? toBufferReply(r) : r));
        if (callback)
          promise.then(
            (r) => callback(null, r),
            (e) => callback(e),
          );
        return promise;
      };
    self[cmd] = make(false);
    self[`${cmd}Buffer`] = make(true);
    void lowerName;
  }

  /** Runs one command synchronously on behalf of a script, with Redis's reply shapes. */
  runForScript(name: string, args: Arg[]): unknown {
    if (name === 'bzpopmin' || name === 'xread') {
      // Blocking forms never block inside a script.
      if (name === 'xread') return streams.readStreams(this.streamHost(), streams.parseXread(args));
      throw new Error('ERR This Redis command is not allowed from script');
    }
    const impl = OVERRIDES[name] ?? mockCommands[name];
    if (!impl) throw new Error(`ERR Unknown Redis command called from script '${name}'`);
    let r = impl.apply(this, args);
    if (r instanceof Promise) throw new Error(`ERR command '${name}' is not available in scripts`);
    if (name === 'hgetall' && r && typeof r === 'object' && !Array.isArray(r)) r = Object.entries(r).flat();
    if (name === 'type') return new StatusReply(String(r));
    if (STATUS_COMMANDS.has(name) && r === 'OK') return new StatusReply('OK');
    return r;
  }

  streamHost(): streams.StreamHost {
    return { data: this.mockData, store: this.store };
  }

  defineCommand(name: string, definition: { numberOfKeys?: number; lua: string }): void {
    const engine = luaEngine();
    const sha = engine.load(definition.lua);
    const fixedKeys = definition.numberOfKeys;
    const run: SyncCommand = function (this: EmbeddedRedis, ...flat: Arg[]) {
      let args = flat;
      let n = fixedKeys;
      if (n === undefined || n === null || n < 0) {
        n = Number(args[0]);
        args = args.slice(1);
      }
      return engine.run(sha, args.slice(0, n), args.slice(n), (c, a) => this.runForScript(c, a));
    };
    this.installCommand(name, run);
    (this as unknown as { customCommands: Record<string, unknown> }).customCommands[name] = (
      this as unknown as Record<string, unknown>
    )[name];
  }

  duplicate(override?: Record<string, unknown>): EmbeddedRedis {
    const options = (this as unknown as { options: Record<string, unknown> }).options;
    return new EmbeddedRedis({ ...options, ...override });
  }

  pipeline(commands: Array<[string, ...unknown[]]> = []): ReturnType<Redis['pipeline']> {
    return createPipeline(
      this as unknown as Record<string, unknown>,
      commands.map(([c, ...a]) => [c, a]),
    ) as ReturnType<Redis['pipeline']>;
  }

  multi(commands: Array<[string, ...unknown[]]> | { pipeline?: boolean } = []): ReturnType<Redis['multi']> {
    const list = Array.isArray(commands) ? commands : [];
    return createPipeline(
      this as unknown as Record<string, unknown>,
      list.map(([c, ...a]) => [c, a]),
    ) as ReturnType<Redis['multi']>;
  }

  connect(): Promise<void> {
    if (this.status === 'ready') return Promise.resolve();
    this.status = 'ready';
    this.store.clients.add(this.clientInfo);
    (this as unknown as { connected: boolean }).connected = true;
    process.nextTick(() => {
      this.emit('connect');
      this.emit('ready');
    });
    return Promise.resolve();
  }

  override disconnect(): void {
    const wasOpen = this.status !== 'end';
    this.status = 'end';
    this.store.clients.delete(this.clientInfo);
    for (const w of [...this.waiters]) w.cancel(new ConnectionClosedError());
    if (wasOpen) super.disconnect();
  }

  /** Waits until `check` yields a value, one of `events` fires, or the timeout passes. */
  waitFor<T>(check: () => T | null, subscribe: (wake: () => void) => () => void, timeoutMs: number): Promise<T | null> {
    const first = check();
    if (first !== null) return Promise.resolve(first);
    return new Promise<T | null>((resolve, reject) => {
      let timer: NodeJS.Timeout | undefined;
      let scheduled = false;
      const finish = (value: T | null, err?: Error) => {
        this.waiters.delete(waiter);
        unsubscribe();
        if (timer) clearTimeout(timer);
        if (err) reject(err);
        else resolve(value);
      };
      const waiter: Waiter = { cancel: (err) => finish(null, err) };
      // Retry after the writer's command (possibly a whole script) has finished.
      const unsubscribe = subscribe(() => {
        if (scheduled) return;
        scheduled = true;
        queueMicrotask(() => {
          scheduled = false;
          if (!this.waiters.has(waiter)) return;
          const value = check();
          if (value !== null) finish(value);
        });
      });
      this.waiters.add(waiter);
      if (timeoutMs > 0) timer = setTimeout(() => finish(null), timeoutMs);
    });
  }

  setClientName(name: string): void {
    this.clientInfo.name = name;
  }
  get clientName(): string {
    return this.clientInfo.name;
  }
  get clientId(): number {
    return this.clientInfo.id;
  }
}

function clientLine(info: ClientInfo): string {
  const age = Math.floor((Date.now() - info.createdAt) / 1000);
  return `id=${info.id} addr=127.0.0.1:${40000 + info.id} laddr=127.0.0.1:6379 fd=${info.id + 7} name=${info.name} age=${age} idle=0 flags=N db=0 sub=0 psub=0 ssub=0 multi=-1 qbuf=0 qbuf-free=0 argv-mem=0 multi-mem=0 rbs=0 rbp=0 obl=0 oll=0 omem=0 tot-mem=0 events=r cmd=client|list user=default redir=-1 resp=2`;
}

function client(this: EmbeddedRedis, sub: Arg, ...args: Arg[]): unknown {
  const word = String(sub ?? '').toUpperCase();
  switch (word) {
    case 'SETNAME': {
      const name = String(args[0] ?? '');
      if (/\s/.test(name)) throw new Error('ERR Client names cannot contain spaces, newlines or special characters.');
      this.setClientName(name);
      return 'OK';
    }
    case 'GETNAME':
      return this.clientName === '' ? null : this.clientName;
    case 'ID':
      return this.clientId;
    case 'LIST':
      return [...this.store.clients].map(clientLine).join('\n') + '\n';
    case 'INFO':
      return `${clientLine({ id: this.clientId, name: this.clientName, createdAt: Date.now() })}\n`;
    case 'SETINFO':
    case 'NO-EVICT':
    case 'NO-TOUCH':
    case 'REPLY':
      return 'OK';
    default:
      throw new Error(`ERR unknown subcommand '${String(sub)}'. Try CLIENT HELP.`);
  }
}

function lexBound(text: string): { value: string; inclusive: boolean; kind: 'min' | 'max' | 'value' } {
  if (text === '-') return { value: '', inclusive: true, kind: 'min' };
  if (text === '+') return { value: '', inclusive: true, kind: 'max' };
  if (text.startsWith('[')) return { value: text.slice(1), inclusive: true, kind: 'value' };
  if (text.startsWith('(')) return { value: text.slice(1), inclusive: false, kind: 'value' };
  throw new Error('ERR min or max not valid string range item');
}

function zlexcount(this: EmbeddedRedis, key: Arg, min: Arg, max: Arg): number {
  const zset = (this as unknown as { data: { get(k: string): unknown } }).data.get(String(key));
  if (!(zset instanceof Map)) return 0;
  const lo = lexBound(String(min));
  const hi = lexBound(String(max));
  let n = 0;
  for (const member of zset.keys()) {
    const m = String(member);
    const aboveLo = lo.kind === 'min' || (lo.kind === 'value' && (lo.inclusive ? m >= lo.value : m > lo.value));
    const belowHi = hi.kind === 'max' || (hi.kind === 'value' && (hi.inclusive ? m <= hi.value : m < hi.value));
    if (aboveLo && belowHi) n++;
  }
  return n;
}

function time(): string[] {
  const micros = BigInt(Date.now()) * 1000n + BigInt(Math.floor(Number(process.hrtime.bigint() % 1000n)));
  return [String(micros / 1000000n), String(micros % 1000000n)];
}

function type(this: EmbeddedRedis, key: Arg): string {
  if (streams.isStreamKey(this.streamHost(), String(key))) return 'stream';
  return mockCommands.type?.call(this, key) as string;
}

function bzpopmin(this: EmbeddedRedis, ...args: Arg[]): Promise<[string, string, string] | null> {
  const timeoutSec = Number(args[args.length - 1]);
  if (!Number.isFinite(timeoutSec) || timeoutSec < 0) throw new Error('ERR timeout is not a float or out of range');
  const keys = args.slice(0, -1).map(String);
  const pop = (): [string, string, string] | null => {
    for (const key of keys) {
      const r = mockCommands.zpopmin?.call(this, key, '1') as unknown[];
      if (r && r.length >= 2) return [key, String(r[0]), String(r[1])];
    }
    return null;
  };
  const events = (this as unknown as { context: MockContext }).context.modifiedKeyEvents;
  return this.waitFor(
    pop,
    (wake) => {
      const listener = (key: string) => {
        if (keys.includes(key)) wake();
      };
      events.on('modified', listener);
      return () => events.off('modified', listener);
    },
    timeoutSec * 1000,
  );
}

function xread(this: EmbeddedRedis, ...args: Arg[]): Promise<unknown> {
  const host = this.streamHost();
  const req = streams.resolveDollar(host, streams.parseXread(args));
  if (req.block === null) return Promise.resolve(streams.readStreams(host, req));
  return this.waitFor(
    () => streams.readStreams(host, req),
    (wake) => {
      const names = req.streams.map((s) => `stream:${s.key}`);
      for (const n of names) this.store.events.on(n, wake);
      return () => {
        for (const n of names) this.store.events.off(n, wake);
      };
    },
    req.block,
  );
}

function evalScript(this: EmbeddedRedis, script: Arg, numKeys: Arg, ...args: Arg[]): unknown {
  const engine = luaEngine();
  const sha = engine.load(script);
  const n = Number(numKeys);
  return engine.run(sha, args.slice(0, n), args.slice(n), (c, a) => this.runForScript(c, a));
}

function evalsha(this: EmbeddedRedis, sha: Arg, numKeys: Arg, ...args: Arg[]): unknown {
  const n = Number(numKeys);
  return luaEngine().run(String(sha).toLowerCase(), args.slice(0, n), args.slice(n), (c, a) => this.runForScript(c, a));
}

function script(this: EmbeddedRedis, sub: Arg, ...args: Arg[]): unknown {
  const word = String(sub).toUpperCase();
  if (word === 'LOAD') return luaEngine().load(args[0] as Arg);
  if (word === 'EXISTS') return args.map((s) => (luaEngine().has(String(s).toLowerCase()) ? 1 : 0));
  if (word === 'FLUSH') return 'OK';
  throw new Error(`ERR unknown subcommand '${String(sub)}'`);
}

const streamCmd = <A extends Arg[]>(fn: (host: streams.StreamHost, key: string, ...rest: A) => unknown): SyncCommand =>
  function (this: EmbeddedRedis, key: Arg, ...rest: Arg[]) {
    return fn(this.streamHost(), String(key), ...(rest as A));
  };

const OVERRIDES: Record<string, SyncCommand> = {
  client: client as SyncCommand,
  zlexcount: zlexcount as SyncCommand,
  time,
  type: type as SyncCommand,
  xadd: streamCmd(streams.xadd),
  xrange: streamCmd(streams.xrange as (h: streams.StreamHost, k: string, ...r: Arg[]) => unknown),
  xrevrange: streamCmd(streams.xrevrange as (h: streams.StreamHost, k: string, ...r: Arg[]) => unknown),
  xlen: streamCmd(streams.xlen),
  xdel: streamCmd(streams.xdel),
  xtrim: streamCmd(streams.xtrim),
  eval: evalScript as SyncCommand,
  evalsha: evalsha as SyncCommand,
  script: script as SyncCommand,
};

/** True for connections made by createEmbeddedRedis (also through BullMQ's proxy). */
export function isEmbeddedRedisInstance(conn: unknown): conn is EmbeddedRedis {
  return (
    conn instanceof EmbeddedRedis ||
    (typeof conn === 'object' && conn !== null && (conn as { isEmbeddedRedis?: unknown }).isEmbeddedRedis === true)
  );
}
