// Redis streams for the embedded connection: XADD ids as <ms>-<seq>, MAXLEN trimming,
// XRANGE/XREVRANGE, XDEL, XTRIM, XLEN and XREAD (BLOCK handled by the caller).
import type { EmbeddedStore, StreamEntry, StreamState } from './store.js';

type Arg = string | Buffer;
/** The part of a mock connection the stream commands need. */
export interface StreamHost {
  data: { get(key: string): unknown; set(key: string, value: unknown): void; has(key: string): boolean };
  store: EmbeddedStore;
}

const MARKER = '__embeddedStream';

function wrongArgs(cmd: string): Error {
  return new Error(`ERR wrong number of arguments for '${cmd}' command`);
}

/** The live stream under key, or undefined (also when the key was deleted or overwritten). */
export function getStream(host: StreamHost, key: string): StreamState | undefined {
  const state = host.store.streams.get(key);
  if (!state) return undefined;
  const marker = host.data.get(key) as Record<string, unknown> | undefined;
  if (!marker || marker[MARKER] !== state.token) {
    host.store.streams.delete(key);
    return undefined;
  }
  return state;
}

export function isStreamKey(host: StreamHost, key: string): boolean {
  return getStream(host, key) !== undefined;
}

function parseId(text: string, missingSeq: number): [number, number] {
  if (text === '-') return [0, 0];
  if (text === '+') return [Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER];
  const [msText, seqText] = text.split('-');
  const ms = Number(msText);
  const seq = seqText === undefined ? missingSeq : Number(seqText);
  if (!Number.isInteger(ms) || !Number.isInteger(seq) || ms < 0 || seq < 0) {
    throw new Error('ERR Invalid stream ID specified as stream command argument');
  }
  return [ms, seq];
}

function compare(e: { ms: number; seq: number }, ms: number, seq: number): number {
  return e.ms !== ms ? e.ms - ms : e.seq - seq;
}

interface TrimSpec {
  strategy: 'MAXLEN' | 'MINID';
  threshold: string;
}

function parseTrim(args: string[], at: number): { spec: TrimSpec; next: number } {
  const strategy = args[at]?.toUpperCase() as 'MAXLEN' | 'MINID';
  let i = at + 1;
  if (args[i] === '~' || args[i] === '=') i++;
  const threshold = args[i];
  if (threshold === undefined) throw new Error('ERR syntax error');
  i++;
  if (args[i]?.toUpperCase() === 'LIMIT') i += 2;
  return { spec: { strategy, threshold }, next: i };
}

function applyTrim(state: StreamState, spec: TrimSpec): number {
  const before = state.entries.length;
  if (spec.strategy === 'MAXLEN') {
    const max = Number(spec.threshold);
    if (!Number.isInteger(max) || max < 0) throw new Error('ERR The MAXLEN argument must be >= 0.');
    if (state.entries.length > max) state.entries.splice(0, state.entries.length - max);
  } else {
    const [ms, seq] = parseId(spec.threshold, 0);
    let cut = 0;
    while (cut < state.entries.length && compare(state.entries[cut] as StreamEntry, ms, seq) < 0) cut++;
    state.entries.splice(0, cut);
  }
  return before - state.entries.length;
}

export function xadd(host: StreamHost, key: string, ...rawArgs: Arg[]): string | null {
  const args = rawArgs.map(String);
  let i = 0;
  let noMkStream = false;
  let trim: TrimSpec | undefined;
  for (;;) {
    const word = args[i]?.toUpperCase();
    if (word === 'NOMKSTREAM') {
      noMkStream = true;
      i++;
    } else if (word === 'MAXLEN' || word === 'MINID') {
      const parsed = parseTrim(args, i);
      trim = parsed.spec;
      i = parsed.next;
    } else break;
  }
  const idText = args[i];
  const fields = rawArgs.slice(i + 1);
  if (idText === undefined || fields.length === 0 || fields.length % 2 !== 0) throw wrongArgs('xadd');
  let state = getStream(host, key);
  if (!state) {
    if (host.data.has(key)) throw new Error('WRONGTYPE Operation against a key holding the wrong kind of value');
    if (noMkStream) return null;
    state = { token: host.store.nextStreamToken++, entries: [], lastMs: 0, lastSeq: 0 };
    host.store.streams.set(key, state);
    host.data.set(key, { [MARKER]: state.token });
  }
  let ms: number;
  let seq: number;
  if (idText === '*') {
    ms = Math.max(Date.now(), state.lastMs);
    seq = ms === state.lastMs ? state.lastSeq + 1 : 0;
  } else if (idText.endsWith('-*')) {
    ms = parseId(idText.slice(0, -2), 0)[0];
    seq = ms === state.lastMs ? state.lastSeq + 1 : 0;
  } else {
    [ms, seq] = parseId(idText, 0);
  }
  const isFirst = state.lastMs === 0 && state.lastSeq === 0;
  if ((ms === 0 && seq === 0) || (!isFirst && (ms < state.lastMs || (ms === state.lastMs && seq <= state.lastSeq)))) {
    throw new Error('ERR The ID specified in XADD is equal or smaller than the target stream top item');
  }
  const id = `${ms}-${seq}`;
  state.entries.push({ ms, seq, id, fields });
  state.lastMs = ms;
  state.lastSeq = seq;
  if (trim) applyTrim(state, trim);
  host.store.events.emit(`stream:${key}`);
  return id;
}

function entryReply(e: StreamEntry): [string, Arg[]] {
  return [e.id, e.fields.slice()];
}

function rangeArgs(args: Arg[], cmd: string): number {
  if (args.length === 0) return Infinity;
  if (String(args[0]).toUpperCase() !== 'COUNT' || args[1] === undefined) throw wrongArgs(cmd);
  const n = Number(args[1]);
  return n < 0 ? Infinity : n;
}

function parseBound(text: string, isStart: boolean): [number, number, boolean] {
  const exclusive = text.startsWith('(');
  const raw = exclusive ? text.slice(1) : text;
  const [ms, seq] = parseId(raw, isStart ? 0 : Number.MAX_SAFE_INTEGER);
  return [ms, seq, exclusive];
}

export function xrange(host: StreamHost, key: string, start: Arg, end: Arg, ...rest: Arg[]): Array<[string, Arg[]]> {
  if (start === undefined || end === undefined) throw wrongArgs('xrange');
  const count = rangeArgs(rest, 'xrange');
  const state = getStream(host, key);
  if (!state) return [];
  const [sMs, sSeq, sEx] = parseBound(String(start), true);
  const [eMs, eSeq, eEx] = parseBound(String(end), false);
  const out: Array<[string, Arg[]]> = [];
  for (const e of state.entries) {
    if (out.length >= count) break;
    const cs = compare(e, sMs, sSeq);
    const ce = compare(e, eMs, eSeq);
    if ((sEx ? cs > 0 : cs >= 0) && (eEx ? ce < 0 : ce <= 0)) out.push(entryReply(e));
  }
  return out;
}

export function xrevrange(host: StreamHost, key: string, end: Arg, start: Arg, ...rest: Arg[]): Array<[string, Arg[]]> {
  if (start === undefined || end === undefined) throw wrongArgs('xrevrange');
  const count = rangeArgs(rest, 'xrevrange');
  const all = xrange(host, key, start, end);
  return all.reverse().slice(0, count === Infinity ? undefined : count);
}

export function xlen(host: StreamHost, key: string): number {
  return getStream(host, key)?.entries.length ?? 0;
}

export function xdel(host: StreamHost, key: string, ...ids: Arg[]): number {
  const state = getStream(host, key);
  if (!state) return 0;
  const wanted = new Set(
    ids.map((id) => {
      const [ms, seq] = parseId(String(id), 0);
      return `${ms}-${seq}`;
    }),
  );
  const before = state.entries.length;
  state.entries = state.entries.filter((e) => !wanted.has(e.id));
  return before - state.entries.length;
}

export function xtrim(host: StreamHost, key: string, ...rawArgs: Arg[]): number {
  const args = rawArgs.map(String);
  const word = args[0]?.toUpperCase();
  if (word !== 'MAXLEN' && word !== 'MINID') throw new Error('ERR syntax error');
  const { spec } = parseTrim(args, 0);
  const state = getStream(host, key);
  return state ? applyTrim(state, spec) : 0;
}

export interface XreadRequest {
  count: number;
  block: number | null;
  streams: Array<{ key: string; id: string }>;
}

export function parseXread(rawArgs: Arg[]): XreadRequest {
  const args = rawArgs.map(String);
  let count = Infinity;
  let block: number | null = null;
  let i = 0;
  for (; i < args.length; i++) {
    const word = (args[i] as string).toUpperCase();
    if (word === 'COUNT') count = Number(args[++i]);
    else if (word === 'BLOCK') block = Number(args[++i]);
    else if (word === 'STREAMS') break;
    else throw new Error('ERR syntax error');
  }
  const rest = args.slice(i + 1);
  if (rest.length === 0 || rest.length % 2 !== 0) {
    throw new Error("ERR Unbalanced 'xread' list of streams: for each stream key an ID or '$' must be specified.");
  }
  const half = rest.length / 2;
  const streams = rest.slice(0, half).map((key, j) => ({ key, id: rest[half + j] as string }));
  return { count, block, streams };
}

/** Replaces `$` by each stream's last id, so a blocked read waits for newer entries. */
export function resolveDollar(host: StreamHost, req: XreadRequest): XreadRequest {
  return {
    ...req,
    streams: req.streams.map((s) => {
      if (s.id !== '$') return s;
      const state = getStream(host, s.key);
      return { key: s.key, id: state ? `${state.lastMs}-${state.lastSeq}` : '0-0' };
    }),
  };
}

/** Entries newer than the given ids; null when there are none (as XREAD replies). */
export function readStreams(host: StreamHost, req: XreadRequest): Array<[string, Array<[string, Arg[]]>]> | null {
  const out: Array<[string, Array<[string, Arg[]]>]> = [];
  for (const { key, id } of req.streams) {
    const state = getStream(host, key);
    if (!state || id === '$') continue;
    const [ms, seq] = parseId(id, 0);
    const found: Array<[string, Arg[]]> = [];
    // Entries are ordered; walk back from the end to the first newer one.
    let start = state.entries.length;
    while (start > 0 && compare(state.entries[start - 1] as StreamEntry, ms, seq) > 0) start--;
    for (let j = start; j < state.entries.length && found.length < req.count; j++) {
      found.push(entryReply(state.entries[j] as StreamEntry));
    }
    if (found.length > 0) out.push([key, found]);
  }
  return out.length > 0 ? out : null;
}
