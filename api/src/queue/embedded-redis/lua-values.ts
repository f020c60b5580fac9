// Moving values between JavaScript and the Lua stack with Redis's conversion rules.
import { lua } from './fengari.js';
import { formatLuaNumber } from './number-format.js';

type L = unknown;
const encoder = new TextEncoder();
const strictDecoder = new TextDecoder('utf-8', { fatal: true });

/** Pushes a JS string or Buffer as a Lua byte string. */
export function pushBytes(L: L, value: string | Uint8Array): void {
  lua.lua_pushstring(L, typeof value === 'string' ? encoder.encode(value) : value);
}

/** Lua byte string to JS: UTF-8 text when valid, else a Buffer with the raw bytes. */
export function bytesToJs(bytes: Uint8Array): string | Buffer {
  try {
    return strictDecoder.decode(bytes);
  } catch {
    return Buffer.from(bytes);
  }
}

/** Lua byte string to a JS string (lossy for binary, used for names and replies). */
export function bytesToText(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

/** Reads a string or number at `idx` as text (Lua's own coercion, patched to %.14g). */
export function toText(L: L, idx: number): string {
  return bytesToText(lua.lua_tolstring(L, idx) as Uint8Array);
}

/** Creates {field = value} on the stack: the shape of status and error replies. */
export function pushFieldTable(L: L, field: 'ok' | 'err', text: string): void {
  lua.lua_createtable(L, 0, 1);
  pushBytes(L, text);
  lua.lua_setfield(L, -2, encoder.encode(field));
}

/**
 * Pushes a command reply as Redis hands it to a script: integers and bulk strings as
 * numbers and strings, nil as false, arrays as tables (nil elements as false).
 */
export function pushReply(L: L, value: unknown): void {
  if (value === null || value === undefined) {
    lua.lua_pushboolean(L, false);
  } else if (typeof value === 'string' || value instanceof Uint8Array) {
    pushBytes(L, value);
  } else if (typeof value === 'number') {
    lua.lua_pushnumber(L, value);
  } else if (typeof value === 'boolean') {
    if (value) lua.lua_pushnumber(L, 1);
    else lua.lua_pushboolean(L, false);
  } else if (Array.isArray(value)) {
    lua.lua_createtable(L, value.length, 0);
    for (let i = 0; i < value.length; i++) {
      pushReply(L, value[i]);
      lua.lua_rawseti(L, -2, i + 1);
    }
  } else if (value instanceof StatusReply) {
    pushFieldTable(L, 'ok', value.text);
  } else {
    // eslint-disable-next-line @typescript-eslint/no-base-to-string -- Redis replies are strings or numbers here
    pushBytes(L, String(value));
  }
}

/** Marks a reply that Redis sends as a status (+OK), which scripts see as {ok=...}. */
export class StatusReply {
  constructor(readonly text: string) {}
}

/** The error a script produced, carried to the caller as a rejected command. */
export class ScriptReplyError extends Error {
  override name = 'ReplyError';
}

const OK = encoder.encode('ok');
const ERR = encoder.encode('err');

/**
 * Converts the value at the top of the stack to a reply, following Redis's Lua-to-RESP
 * rules: numbers truncated to integers, true → 1, false/nil → nil, {err=} → error,
 * {ok=} → status, other tables → arrays read up to the first nil.
 */
export function toReply(L: L, idx: number): unknown {
  const t = lua.lua_type(L, idx);
  switch (t) {
    case lua.LUA_TNUMBER:
      return Math.trunc(lua.lua_tonumber(L, idx));
    case lua.LUA_TSTRING:
      return toText(L, idx);
    case lua.LUA_TBOOLEAN:
      return lua.lua_toboolean(L, idx) ? 1 : null;
    case lua.LUA_TTABLE:
      return tableToReply(L, lua.lua_absindex(L, idx));
    default:
      return null;
  }
}

function tableToReply(L: L, idx: number): unknown {
  lua.lua_pushstring(L, ERR);
  lua.lua_rawget(L, idx);
  if (lua.lua_type(L, -1) === lua.LUA_TSTRING) {
    const msg = toText(L, -1);
    lua.lua_pop(L, 1);
    return new ScriptReplyError(msg);
  }
  lua.lua_pop(L, 1);
  lua.lua_pushstring(L, OK);
  lua.lua_rawget(L, idx);
  if (lua.lua_type(L, -1) === lua.LUA_TSTRING) {
    const msg = toText(L, -1);
    lua.lua_pop(L, 1);
    return msg;
  }
  lua.lua_pop(L, 1);
  const out: unknown[] = [];
  for (let j = 1; ; j++) {
    lua.lua_rawgeti(L, idx, j);
    if (lua.lua_type(L, -1) === lua.LUA_TNIL) {
      lua.lua_pop(L, 1);
      return out;
    }
    const item = toReply(L, -1);
    lua.lua_pop(L, 1);
    // An error nested in an array is sent as an error element; keep it as a value.
    out.push(item);
  }
}

export { formatLuaNumber };
