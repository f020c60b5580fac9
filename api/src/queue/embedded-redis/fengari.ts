// Loads fengari (the Lua VM bundled with ioredis-mock) and makes its numbers behave as
// Redis's Lua 5.1 doubles while our scripts run. Fengari is Lua 5.3 with 32-bit integers:
// literals such as 1700000000000 or 0x100000000 would wrap and whole floats would print as
// "3.0". Fengari's lexer, tonumber, string coercion, tostring and concatenation all reach
// lobject.luaO_str2num / luaO_tostring through the module object, so replacing those two
// exports (scoped by `inLua`, other fengari users are untouched) is enough.
import { createRequire } from 'node:module';
import { formatLuaNumber } from './number-format.js';

const require = createRequire(import.meta.url);

/* eslint-disable @typescript-eslint/no-explicit-any -- fengari ships no types */
export const fengari: any = require('fengari');
const lobject: any = require('fengari/src/lobject.js');
const lstring: any = require('fengari/src/lstring.js');
/* eslint-enable @typescript-eslint/no-explicit-any */

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
  lobject.luaO_str2num = function str2num(
    s: Uint8Array,
    o: { ttisinteger(): boolean; value: number; setfltvalue(n: number): void },
  ): number {
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
  lobject.luaO_tostring = function tostring(
    L: unknown,
    obj: { ttisfloat(): boolean; value: number; setsvalue(ts: unknown): void },
  ): void {
    if (depth === 0 || !obj.ttisfloat()) return origTostring(L, obj);
    obj.setsvalue(lstring.luaS_bless(L, new TextEncoder().encode(formatLuaNumber(obj.value))));
  };
  lobject.__driftgridDoubles = true;
}

installPatch();
