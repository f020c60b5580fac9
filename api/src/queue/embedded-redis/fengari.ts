// Loads fengari (the Lua VM bundled with ioredis-mock) and makes its numbers behave as
// Redis's Lua 5.1 doubles while our scripts run. Fengari is Lua 5.3 with 32-bit integers:
// literals such as 1700000000000 or 0x100000000 would wrap and whole floats would print as
// "3.0". Fengari's lexer, tonumber, string coercion, tostring and concatenation all reach
// lobject.luaO_str2num / luaO_tostring through the module object, so replacing those two
// exports (scoped by `inLua`, other fengari users are untouched) is enough.
import { createRequire } from 'node:module';
import { formatLuaNumber } from './number-format.js';

const require = createRequire(import.meta.url);

/** A fengari Lua state; opaque here, only ever handed back to fengari. */
export type LuaState = unknown;
type Bytes = Uint8Array;

// Fengari ships no types: the part of its C-like API our scripts use, typed once here so the
// rest of the embedded Redis is checked like any other code (fengari's lapi.js, lauxlib.js).
export interface LuaApi {
  readonly LUA_OK: number;
  readonly LUA_TNIL: number;
  readonly LUA_TBOOLEAN: number;
  readonly LUA_TLIGHTUSERDATA: number;
  readonly LUA_TNUMBER: number;
  readonly LUA_TSTRING: number;
  readonly LUA_TTABLE: number;
  readonly LUA_REGISTRYINDEX: number;
  lua_absindex(L: LuaState, idx: number): number;
  lua_checkstack(L: LuaState, n: number): boolean;
  lua_createtable(L: LuaState, narr: number, nrec: number): void;
  lua_gettop(L: LuaState): number;
  /** 1 while there is a next key (pushed with its value), 0 at the end. */
  lua_next(L: LuaState, idx: number): number;
  lua_pcall(L: LuaState, nargs: number, nresults: number, msgh: number): number;
  lua_pop(L: LuaState, n: number): void;
  lua_pushboolean(L: LuaState, b: boolean): void;
  lua_pushglobaltable(L: LuaState): void;
  lua_pushjsfunction(L: LuaState, fn: (L: LuaState) => number): void;
  lua_pushlightuserdata(L: LuaState, p: object): void;
  lua_pushnil(L: LuaState): void;
  lua_pushnumber(L: LuaState, n: number): void;
  lua_pushstring(L: LuaState, s: Bytes): Bytes;
  lua_pushvalue(L: LuaState, idx: number): void;
  lua_rawget(L: LuaState, idx: number): number;
  lua_rawgeti(L: LuaState, idx: number, n: number): number;
  lua_rawset(L: LuaState, idx: number): void;
  lua_rawseti(L: LuaState, idx: number, n: number): void;
  lua_setfield(L: LuaState, idx: number, k: Bytes): void;
  lua_setglobal(L: LuaState, name: Bytes): void;
  lua_setmetatable(L: LuaState, idx: number): void;
  lua_settop(L: LuaState, idx: number): void;
  lua_setupvalue(L: LuaState, funcindex: number, n: number): Bytes | null;
  lua_toboolean(L: LuaState, idx: number): boolean;
  lua_tolstring(L: LuaState, idx: number): Bytes | null;
  lua_tonumber(L: LuaState, idx: number): number;
  lua_touserdata(L: LuaState, idx: number): unknown;
  lua_type(L: LuaState, idx: number): number;
  lua_typename(L: LuaState, t: number): Bytes;
}

export interface LauxLib {
  luaL_checkany(L: LuaState, arg: number): void;
  luaL_checklstring(L: LuaState, arg: number): Bytes;
  luaL_dostring(L: LuaState, s: Bytes): number;
  /** Raises a Lua error (throws); typed as returning so a C function can `return luaL_error(...)`. */
  luaL_error(L: LuaState, fmt: Bytes, ...args: unknown[]): never;
  luaL_loadbuffer(L: LuaState, buff: Bytes, size: number, name: Bytes): number;
  luaL_newstate(): LuaState;
  luaL_ref(L: LuaState, t: number): number;
}

interface Fengari {
  lua: LuaApi;
  lauxlib: LauxLib;
  lualib: { luaL_openlibs(L: LuaState): void };
}

/** The two number routines of fengari's lobject.js that the patch below replaces. */
interface LObject {
  __driftgridDoubles?: boolean;
  luaO_str2num: (s: Uint8Array, o: LuaNumberSlot) => number;
  luaO_tostring: (L: LuaState, obj: LuaStringSlot) => void;
}
interface LuaNumberSlot {
  ttisinteger(): boolean;
  value: number;
  setfltvalue(n: number): void;
}
interface LuaStringSlot {
  ttisfloat(): boolean;
  value: number;
  setsvalue(ts: unknown): void;
}

export const fengari = require('fengari') as Fengari;
const lobject = require('fengari/src/lobject.js') as LObject;
const lstring = require('fengari/src/lstring.js') as { luaS_bless(L: LuaState, s: Uint8Array): unknown };

export const lua = fengari.lua;
export const lauxlib = fengari.lauxlib;
export const lualib = fengari.lualib;

let depth = 0;

/** Runs `fn` with the double-number semantics switched on (re-entrant). */
export function withLuaNumbers<T>(fn: () => T): T {
  depth++;
  try {
    return fn();
  } finally {
    depth--;
  }
}

const HEX = /^\s*([-+]?)0[xX]([0-9a-fA-F]+)\s*$/;
const textDecoder = new TextDecoder();

function installPatch(): void {
  if (lobject.__driftgridDoubles) return;
  const origStr2num = lobject.luaO_str2num;
  const origTostring = lobject.luaO_tostring;
  lobject.luaO_str2num = function str2num(s: Uint8Array, o: LuaNumberSlot): number {
    const r = origStr2num(s, o);
    if (depth === 0 || r === 0 || !o.ttisinteger()) return r;
    // Integer result: redo hex literals as doubles (fengari wraps them at 32 bits), and
    // turn every decimal integer into a float as Lua 5.1 would hold it.
    const end = s.indexOf(0);
    const text = textDecoder.decode(end >= 0 ? s.subarray(0, end) : s);
    const hex = HEX.exec(text);
    if (hex) {
      const v = parseInt(hex[2] as string, 16);
      o.setfltvalue(hex[1] === '-' ? -v : v);
    } else {
      o.setfltvalue(o.value);
    }
    return r;
  };
  lobject.luaO_tostring = function tostring(L: LuaState, obj: LuaStringSlot): void {
    if (depth === 0 || !obj.ttisfloat()) return origTostring(L, obj);
    obj.setsvalue(lstring.luaS_bless(L, new TextEncoder().encode(formatLuaNumber(obj.value))));
  };
  lobject.__driftgridDoubles = true;
}

installPatch();
