// One long-lived Lua state for every embedded connection. Each script is compiled once
// (keyed by SHA1) and each call runs the compiled chunk with a fresh global environment
// (KEYS, ARGV and any globals the script sets live there and vanish after the call), so
// reusing the state does not leak globals between calls.
import { createHash } from 'node:crypto';
import { lua, lauxlib, lualib, withLuaNumbers } from './fengari.js';
import { openRedisLibs } from './lua-libs.js';
import { bytesToJs, pushBytes, pushFieldTable, pushReply, ScriptReplyError, toReply, toText } from './lua-values.js';
import { numberToRedisArg } from './number-format.js';

type L = unknown;
const encoder = new TextEncoder();

/** Runs one Redis command synchronously for a script; throws on a command error. */
export type ScriptCommandRunner = (name: string, args: Array<string | Buffer>) => unknown;

export function sha1(text: string | Buffer): string {
  return createHash('sha1').update(text).digest('hex');
}

// Redis's Lua 5.1 names that 5.3 moved or dropped, and the redis.* helpers written in Lua.
const PRELUDE = `
unpack = table.unpack
-- luaL_tolstring formats floats with its own "%.14g" plus ".0"; concatenation goes through
-- the patched number formatting, so route numbers there.
do
  local base_tostring = tostring
  tostring = function(v)
    if type(v) == 'number' then return v .. '' end
    return base_tostring(v)
  end
end
table.getn = function(t) return #t end
math.pow = function(a, b) return a ^ b end
math.mod = math.fmod
string.gfind = string.gmatch
loadstring = nil
dofile = nil
loadfile = nil
load = nil
require = nil
package = nil
io = nil
debug = nil
os = { clock = os.clock, time = os.time }
redis.error_reply = function(e) return { err = e } end
redis.status_reply = function(s) return { ok = s } end
redis.log = function() end
redis.LOG_DEBUG = 0
redis.LOG_VERBOSE = 1
redis.LOG_NOTICE = 2
redis.LOG_WARNING = 3
redis.setresp = function() end
redis.replicate_commands = function() return true end
redis.set_repl = function() end
redis.REPL_NONE = 0
redis.REPL_AOF = 1
redis.REPL_SLAVE = 2
redis.REPL_REPLICA = 2
redis.REPL_ALL = 3
`;

export class LuaEngine {
  private readonly L: L;
  private readonly compiled = new Map<string, number>();
  private readonly envMetaRef: number;
  private runner: ScriptCommandRunner | null = null;

  constructor() {
    this.L = lauxlib.luaL_newstate();
    const L = this.L;
    this.envMetaRef = withLuaNumbers(() => {
      lualib.luaL_openlibs(L);
      lua.lua_createtable(L, 0, 4);
      this.setFunction('call', (l) => this.redisCall(l, false));
      this.setFunction('pcall', (l) => this.redisCall(l, true));
      this.setFunction('sha1hex', (l) => {
        pushBytes(l, sha1(Buffer.from(lauxlib.luaL_checklstring(l, 1) as Uint8Array)));
        return 1;
      });
      lua.lua_setglobal(L, encoder.encode('redis'));
      openRedisLibs(L);
      if (lauxlib.luaL_dostring(L, encoder.encode(PRELUDE)) !== lua.LUA_OK) {
        throw new Error(`embedded redis: Lua prelude failed: ${toText(L, -1)}`);
      }
      // Environment metatable for each call: reads fall through to the shared globals.
      lua.lua_createtable(L, 0, 1);
      lua.lua_pushglobaltable(L);
      lua.lua_setfield(L, -2, encoder.encode('__index'));
      return lauxlib.luaL_ref(L, lua.LUA_REGISTRYINDEX) as number;
    });
  }

  private setFunction(name: string, fn: (L: L) => number): void {
    lua.lua_pushjsfunction(this.L, fn);
    lua.lua_setfield(this.L, -2, encoder.encode(name));
  }

  /** Compiles a script (once) and returns its SHA1. Throws on a syntax error. */
  load(script: string | Buffer): string {
    const sha = sha1(script);
    if (this.compiled.has(sha)) return sha;
    const L = this.L;
    const bytes = typeof script === 'string' ? encoder.encode(script) : new Uint8Array(script);
    withLuaNumbers(() => {
      const status = lauxlib.luaL_loadbuffer(L, bytes, bytes.length, encoder.encode(`@user_script`));
      if (status !== lua.LUA_OK) {
        const msg = toText(L, -1);
        lua.lua_pop(L, 1);
        throw new ScriptReplyError(`ERR Error compiling script (new function): ${msg}`);
      }
      this.compiled.set(sha, lauxlib.luaL_ref(L, lua.LUA_REGISTRYINDEX));
    });
    return sha;
  }

  has(sha: string): boolean {
    return this.compiled.has(sha);
  }

  /** Runs a compiled script; `runner` executes its redis.call commands. */
  run(sha: string, keys: Array<string | Buffer>, argv: Array<string | Buffer>, runner: ScriptCommandRunner): unknown {
    const ref = this.compiled.get(sha);
    if (ref === undefined) throw new ScriptReplyError('NOSCRIPT No matching script. Please use EVAL.');
    const L = this.L;
    const top = lua.lua_gettop(L);
    const previous = this.runner;
    this.runner = runner;
    try {
      return withLuaNumbers(() => {
        lua.lua_rawgeti(L, lua.LUA_REGISTRYINDEX, ref);
        lua.lua_createtable(L, 0, 2);
        pushStringArray(L, keys);
        lua.lua_setfield(L, -2, encoder.encode('KEYS'));
        pushStringArray(L, argv);
        lua.lua_setfield(L, -2, encoder.encode('ARGV'));
        lua.lua_rawgeti(L, lua.LUA_REGISTRYINDEX, this.envMetaRef);
        lua.lua_setmetatable(L, -2);
        lua.lua_setupvalue(L, -2, 1); // the chunk's _ENV
        const status = lua.lua_pcall(L, 0, 1, 0);
        if (status !== lua.LUA_OK) {
          const msg =
            lua.lua_type(L, -1) === lua.LUA_TTABLE
              ? String((toReply(L, -1) as Error).message ?? 'error')
              : toText(L, -1);
          throw new ScriptReplyError(msg.startsWith('ERR') ? msg : `ERR user_script: ${msg} script: ${sha}`);
        }
        const reply = toReply(L, -1);
        if (reply instanceof ScriptReplyError) throw reply;
        return reply;
      });
    } finally {
      lua.lua_settop(L, top);
      this.runner = previous;
    }
  }

  private redisCall(L: L, protectedCall: boolean): number {
    const n = lua.lua_gettop(L);
    if (n === 0)
      return lauxlib.luaL_error(L, encoder.encode('Please specify at least one argument for this redis lib call'));
    const args: Array<string | Buffer> = [];
    for (let i = 1; i <= n; i++) {
      const t = lua.lua_type(L, i);
      if (t === lua.LUA_TSTRING) args.push(bytesToJs(lua.lua_tolstring(L, i) as Uint8Array));
      else if (t === lua.LUA_TNUMBER) args.push(numberToRedisArg(lua.lua_tonumber(L, i)));
      else return lauxlib.luaL_error(L, encoder.encode('Lua redis lib command arguments must be strings or integers'));
    }
    const name = String(args[0]).toLowerCase();
    let result: unknown;
    let failure: string | null = null;
    try {
      if (!this.runner) throw new Error('ERR redis.call outside a script');
      result = this.runner(name, args.slice(1));
    } catch (e) {
      failure = e instanceof Error ? e.message : String(e);
    }
    if (failure !== null) {
      if (protectedCall) {
        pushFieldTable(L, 'err', failure);
        return 1;
      }
      return lauxlib.luaL_error(L, encoder.encode(failure));
    }
    pushReply(L, result);
    return 1;
  }
}

function pushStringArray(L: L, items: Array<string | Buffer>): void {
  lua.lua_createtable(L, items.length, 0);
  for (let i = 0; i < items.length; i++) {
    pushBytes(L, items[i] as string | Buffer);
    lua.lua_rawseti(L, -2, i + 1);
  }
}

let shared: LuaEngine | null = null;

/** The process-wide engine (scripts are pure functions of their text, so one cache serves all). */
export function luaEngine(): LuaEngine {
  shared ??= new LuaEngine();
  return shared;
}
