// cjson and cmsgpack for the script VM, written against the Lua stack. Redis ships both
// libraries to scripts; BullMQ decodes its msgpack-packed options and JSON job options.
import { lua, lauxlib } from './fengari.js';
import { bytesToText, pushBytes } from './lua-values.js';
import { formatLuaNumber } from './number-format.js';

type L = unknown;
const encoder = new TextEncoder();

/** The value cjson.decode gives JSON null, exposed to scripts as cjson.null. */
export const CJSON_NULL = Object.freeze({ cjsonNull: true });

// ---------------------------------------------------------------- JSON

function pushJson(L: L, v: unknown): void {
  lua.lua_checkstack(L, 4);
  if (v === null) lua.lua_pushlightuserdata(L, CJSON_NULL);
  else if (typeof v === 'string') pushBytes(L, v);
  else if (typeof v === 'number') lua.lua_pushnumber(L, v);
  else if (typeof v === 'boolean') lua.lua_pushboolean(L, v);
  else if (Array.isArray(v)) {
    lua.lua_createtable(L, v.length, 0);
    v.forEach((item, i) => {
      pushJson(L, item);
      lua.lua_rawseti(L, -2, i + 1);
    });
  } else {
    const entries = Object.entries(v as Record<string, unknown>);
    lua.lua_createtable(L, 0, entries.length);
    for (const [k, item] of entries) {
      pushBytes(L, k);
      pushJson(L, item);
      lua.lua_rawset(L, -3);
    }
  }
}

function cjsonDecode(L: L): number {
  const text = bytesToText(lauxlib.luaL_checklstring(L, 1) as Uint8Array);
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    return lauxlib.luaL_error(L, encoder.encode(`cjson.decode: ${(e as Error).message}`));
  }
  pushJson(L, parsed);
  return 1;
}

/** Keys of the table at idx, or null when it is not an array in cjson's sense. */
function arrayLength(L: L, idx: number): number | null {
  let max = 0;
  let count = 0;
  lua.lua_pushnil(L);
  while (lua.lua_next(L, idx) !== 0) {
    lua.lua_pop(L, 1);
    if (lua.lua_type(L, -1) !== lua.LUA_TNUMBER) {
      lua.lua_pop(L, 1);
      return null;
    }
    const k = lua.lua_tonumber(L, -1);
    if (!Number.isInteger(k) || k < 1) {
      lua.lua_pop(L, 1);
      return null;
    }
    max = Math.max(max, k);
    count++;
  }
  // cjson's default sparse rule: encode as array unless max > 2 * count and max > 10.
  if (max > 10 && max > count * 2) return null;
  return count === 0 ? null : max;
}

function encodeJson(L: L, idx: number, depth: number): string {
  if (depth > 1000) throw new Error('cjson.encode: nesting too deep');
  switch (lua.lua_type(L, idx)) {
    case lua.LUA_TNIL:
      return 'null';
    case lua.LUA_TBOOLEAN:
      return lua.lua_toboolean(L, idx) ? 'true' : 'false';
    case lua.LUA_TNUMBER:
      return formatLuaNumber(lua.lua_tonumber(L, idx));
    case lua.LUA_TSTRING:
      return JSON.stringify(bytesToText(lua.lua_tolstring(L, idx) as Uint8Array));
    case lua.LUA_TLIGHTUSERDATA:
      if (lua.lua_touserdata(L, idx) === CJSON_NULL) return 'null';
      throw new Error('cjson.encode: cannot serialise userdata');
    case lua.LUA_TTABLE: {
      const abs = lua.lua_absindex(L, idx);
      lua.lua_checkstack(L, 6);
      const n = arrayLength(L, abs);
      if (n !== null) {
        const parts: string[] = [];
        for (let i = 1; i <= n; i++) {
          lua.lua_rawgeti(L, abs, i);
          parts.push(encodeJson(L, -1, depth + 1));
          lua.lua_pop(L, 1);
        }
        return `[${parts.join(',')}]`;
      }
      const parts: string[] = [];
      lua.lua_pushnil(L);
      while (lua.lua_next(L, abs) !== 0) {
        const keyType = lua.lua_type(L, -2);
        if (keyType !== lua.LUA_TSTRING && keyType !== lua.LUA_TNUMBER) {
          throw new Error('cjson.encode: table key must be a number or string');
        }
        // Copy the key before converting it: tolstring on the key itself would confuse lua_next.
        lua.lua_pushvalue(L, -2);
        const key = bytesToText(lua.lua_tolstring(L, -1) as Uint8Array);
        lua.lua_pop(L, 1);
        parts.push(`${JSON.stringify(key)}:${encodeJson(L, -1, depth + 1)}`);
        lua.lua_pop(L, 1);
      }
      return `{${parts.join(',')}}`;
    }
    default:
      throw new Error(`cjson.encode: cannot serialise ${bytesToText(lua.lua_typename(L, lua.lua_type(L, idx)))}`);
  }
}

function cjsonEncode(L: L): number {
  lauxlib.luaL_checkany(L, 1);
  let text: string;
  try {
    text = encodeJson(L, 1, 0);
  } catch (e) {
    return lauxlib.luaL_error(L, encoder.encode((e as Error).message));
  }
  pushBytes(L, text);
  return 1;
}

// ---------------------------------------------------------------- msgpack

class MsgpackReader {
  private pos = 0;
  private readonly view: DataView;
  constructor(private readonly bytes: Uint8Array) {
    this.view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  }
  get done(): boolean {
    return this.pos >= this.bytes.length;
  }
  private need(n: number): number {
    if (this.pos + n > this.bytes.length) throw new Error('cmsgpack.unpack: truncated input');
    const at = this.pos;
    this.pos += n;
    return at;
  }
  /** Decodes one object and pushes it on the Lua stack. */
  push(L: L): void {
    lua.lua_checkstack(L, 4);
    const b = this.view.getUint8(this.need(1));
    if (b <= 0x7f) return lua.lua_pushnumber(L, b);
    if (b >= 0xe0) return lua.lua_pushnumber(L, b - 0x100);
    if (b >= 0x80 && b <= 0x8f) return this.pushMap(L, b & 0x0f);
    if (b >= 0x90 && b <= 0x9f) return this.pushArray(L, b & 0x0f);
    if (b >= 0xa0 && b <= 0xbf) return this.pushRaw(L, b & 0x1f);
    const v = this.view;
    switch (b) {
      case 0xc0:
        return lua.lua_pushnil(L);
      case 0xc2:
        return lua.lua_pushboolean(L, false);
      case 0xc3:
        return lua.lua_pushboolean(L, true);
      case 0xc4:
      case 0xd9:
        return this.pushRaw(L, v.getUint8(this.need(1)));
      case 0xc5:
      case 0xda:
        return this.pushRaw(L, v.getUint16(this.need(2)));
      case 0xc6:
      case 0xdb:
        return this.pushRaw(L, v.getUint32(this.need(4)));
      case 0xca:
        return lua.lua_pushnumber(L, v.getFloat32(this.need(4)));
      case 0xcb:
        return lua.lua_pushnumber(L, v.getFloat64(this.need(8)));
      case 0xcc:
        return lua.lua_pushnumber(L, v.getUint8(this.need(1)));
      case 0xcd:
        return lua.lua_pushnumber(L, v.getUint16(this.need(2)));
      case 0xce:
        return lua.lua_pushnumber(L, v.getUint32(this.need(4)));
      case 0xcf:
        return lua.lua_pushnumber(L, Number(v.getBigUint64(this.need(8))));
      case 0xd0:
        return lua.lua_pushnumber(L, v.getInt8(this.need(1)));
      case 0xd1:
        return lua.lua_pushnumber(L, v.getInt16(this.need(2)));
      case 0xd2:
        return lua.lua_pushnumber(L, v.getInt32(this.need(4)));
      case 0xd3:
        return lua.lua_pushnumber(L, Number(v.getBigInt64(this.need(8))));
      case 0xdc:
        return this.pushArray(L, v.getUint16(this.need(2)));
      case 0xdd:
        return this.pushArray(L, v.getUint32(this.need(4)));
      case 0xde:
        return this.pushMap(L, v.getUint16(this.need(2)));
      case 0xdf:
        return this.pushMap(L, v.getUint32(this.need(4)));
      // Extensions carry no Lua meaning; like cmsgpack, hand the payload over as bytes.
      case 0xd4:
        return this.pushExt(L, 1);
      case 0xd5:
        return this.pushExt(L, 2);
      case 0xd6:
        return this.pushExt(L, 4);
      case 0xd7:
        return this.pushExt(L, 8);
      case 0xd8:
        return this.pushExt(L, 16);
      case 0xc7:
        return this.pushExt(L, v.getUint8(this.need(1)));
      case 0xc8:
        return this.pushExt(L, v.getUint16(this.need(2)));
      case 0xc9:
        return this.pushExt(L, v.getUint32(this.need(4)));
      default:
        throw new Error(`cmsgpack.unpack: bad type byte 0x${b.toString(16)}`);
    }
  }
  private pushRaw(L: L, n: number): void {
    const at = this.need(n);
    lua.lua_pushstring(L, this.bytes.subarray(at, at + n));
  }
  private pushExt(L: L, n: number): void {
    this.need(1); // type tag
    this.pushRaw(L, n);
  }
  private pushArray(L: L, n: number): void {
    lua.lua_createtable(L, n, 0);
    for (let i = 1; i <= n; i++) {
      this.push(L);
      lua.lua_rawseti(L, -2, i);
    }
  }
  private pushMap(L: L, n: number): void {
    lua.lua_createtable(L, 0, n);
    for (let i = 0; i < n; i++) {
      this.push(L);
      this.push(L);
      if (lua.lua_type(L, -2) === lua.LUA_TNIL)
        lua.lua_pop(L, 2); // nil keys cannot be stored
      else lua.lua_rawset(L, -3);
    }
  }
}

function cmsgpackUnpack(L: L): number {
  const bytes = lauxlib.luaL_checklstring(L, 1) as Uint8Array;
  const reader = new MsgpackReader(bytes);
  let count = 0;
  try {
    while (!reader.done) {
      reader.push(L);
      count++;
    }
  } catch (e) {
    return lauxlib.luaL_error(L, encoder.encode((e as Error).message));
  }
  return count;
}

function packValue(L: L, idx: number, out: number[], depth: number): void {
  if (depth > 1000) throw new Error('cmsgpack.pack: nesting too deep');
  const t = lua.lua_type(L, idx);
  if (t === lua.LUA_TNIL) out.push(0xc0);
  else if (t === lua.LUA_TBOOLEAN) out.push(lua.lua_toboolean(L, idx) ? 0xc3 : 0xc2);
  else if (t === lua.LUA_TNUMBER) packNumber(lua.lua_tonumber(L, idx), out);
  else if (t === lua.LUA_TSTRING) packRaw(lua.lua_tolstring(L, idx) as Uint8Array, out);
  else if (t === lua.LUA_TTABLE) {
    const abs = lua.lua_absindex(L, idx);
    lua.lua_checkstack(L, 6);
    const n = arrayLength(L, abs);
    if (n !== null) {
      packHeader(n, 0x90, 0xdc, out);
      for (let i = 1; i <= n; i++) {
        lua.lua_rawgeti(L, abs, i);
        packValue(L, -1, out, depth + 1);
        lua.lua_pop(L, 1);
      }
    } else {
      let count = 0;
      const body: number[] = [];
      lua.lua_pushnil(L);
      while (lua.lua_next(L, abs) !== 0) {
        packValue(L, -2, body, depth + 1);
        packValue(L, -1, body, depth + 1);
        lua.lua_pop(L, 1);
        count++;
      }
      packHeader(count, 0x80, 0xde, out);
      for (const x of body) out.push(x);
    }
  } else out.push(0xc0);
}

function packHeader(n: number, fix: number, wide16: number, out: number[]): void {
  if (n < 16) out.push(fix | n);
  else if (n < 0x10000) out.push(wide16, n >> 8, n & 0xff);
  else out.push(wide16 + 1, (n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff);
}

function packRaw(bytes: Uint8Array, out: number[]): void {
  const n = bytes.length;
  if (n < 32) out.push(0xa0 | n);
  else if (n < 0x100) out.push(0xd9, n);
  else if (n < 0x10000) out.push(0xda, n >> 8, n & 0xff);
  else out.push(0xdb, (n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff);
  for (const x of bytes) out.push(x);
}

function packNumber(n: number, out: number[]): void {
  const buf = new DataView(new ArrayBuffer(9));
  if (Number.isInteger(n) && n >= 0 && n < 0x80) out.push(n);
  else if (Number.isInteger(n) && n < 0 && n >= -32) out.push(n + 0x100);
  else if (Number.isSafeInteger(n)) {
    if (n >= 0) {
      buf.setUint8(0, 0xcf);
      buf.setBigUint64(1, BigInt(n));
    } else {
      buf.setUint8(0, 0xd3);
      buf.setBigInt64(1, BigInt(n));
    }
    for (let i = 0; i < 9; i++) out.push(buf.getUint8(i));
  } else {
    buf.setUint8(0, 0xcb);
    buf.setFloat64(1, n);
    for (let i = 0; i < 9; i++) out.push(buf.getUint8(i));
  }
}

function cmsgpackPack(L: L): number {
  const out: number[] = [];
  const n = lua.lua_gettop(L);
  try {
    for (let i = 1; i <= n; i++) packValue(L, i, out, 0);
  } catch (e) {
    return lauxlib.luaL_error(L, encoder.encode((e as Error).message));
  }
  lua.lua_pushstring(L, Uint8Array.from(out));
  return 1;
}

function setFunction(L: L, name: string, fn: (L: L) => number): void {
  lua.lua_pushjsfunction(L, fn);
  lua.lua_setfield(L, -2, encoder.encode(name));
}

/** Defines the global tables `cjson` and `cmsgpack`. */
export function openRedisLibs(L: L): void {
  lua.lua_createtable(L, 0, 3);
  setFunction(L, 'encode', cjsonEncode);
  setFunction(L, 'decode', cjsonDecode);
  lua.lua_pushlightuserdata(L, CJSON_NULL);
  lua.lua_setfield(L, -2, encoder.encode('null'));
  lua.lua_setglobal(L, encoder.encode('cjson'));

  lua.lua_createtable(L, 0, 2);
  setFunction(L, 'pack', cmsgpackPack);
  setFunction(L, 'unpack', cmsgpackUnpack);
  lua.lua_setglobal(L, encoder.encode('cmsgpack'));
}
