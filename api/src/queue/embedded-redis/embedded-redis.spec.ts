// Behaviour of the embedded Redis's script runtime and added commands, against Redis's
// documented semantics: "Lua API reference" and "Conversion between Lua and Redis data
// types" (redis.io programmability docs), Redis command reference (XADD, XREAD, BZPOPMIN,
// ZLEXCOUNT), the C99 printf "%.14g" rule Lua 5.1 uses (ISO C 7.19.6.1), and the msgpack spec.
import { afterAll, describe, expect, it } from 'vitest';
import { createEmbeddedRedis, isEmbeddedRedis, resetEmbeddedRedis } from './index.js';
import { formatLuaNumber } from './number-format.js';

/* eslint-disable @typescript-eslint/no-explicit-any -- commands are called dynamically */
const r: any = createEmbeddedRedis({ name: 'spec' });
const other: any = r.duplicate();
afterAll(() => {
  r.disconnect();
  other.disconnect();
  resetEmbeddedRedis();
});

const ev = (script: string, keys: string[] = [], argv: unknown[] = []) => r.eval(script, keys.length, ...keys, ...argv);

describe('%.14g number formatting (C99 printf rule)', () => {
  it.each([
    [3, '3'],
    [1700000000000, '1700000000000'],
    [0.1 + 0.2, '0.3'],
    [1e15, '1e+15'],
    [2 ** 53, '9.007199254741e+15'],
    [0.0001, '0.0001'],
    [0.00001, '1e-05'],
    [-2.5, '-2.5'],
  ])('%s prints as %s', (n, text) => {
    expect(formatLuaNumber(n)).toBe(text);
  });
});

describe('Lua numbers behave as Redis Lua 5.1 doubles', () => {
  it('keeps millisecond timestamps and large hex literals exact', async () => {
    expect(await ev('return 1700000000000 + 1')).toBe(1700000000001);
    expect(await ev('return tostring(0x100000000)')).toBe('4294967296');
    expect(await ev('return 5 % 0x100000000')).toBe(5);
    expect(await ev('return tonumber(ARGV[1]) * 1000', [], ['1700000000'])).toBe(1700000000000);
  });
  it('prints whole numbers without ".0" in concatenation and tostring', async () => {
    expect(await ev('return "id:" .. (10 / 2) .. "," .. tostring(3)')).toBe('id:5,3');
  });
});

describe('Lua-to-Redis reply conversion (Redis docs)', () => {
  it('truncates numbers, maps booleans and stops arrays at the first nil', async () => {
    expect(await ev('return 3.99')).toBe(3);
    expect(await ev('return true')).toBe(1);
    expect(await ev('return false')).toBeNull();
    expect(await ev('local t = {} t[#t+1] = "a" t[#t+1] = 2 return t')).toEqual(['a', 2]);
    expect(await ev('return {1, 2, nil, 4}')).toEqual([1, 2]);
  });
  it('turns {ok=} into a status and {err=} into an error', async () => {
    expect(await ev('return redis.status_reply("FINE")')).toBe('FINE');
    await expect(ev('return redis.error_reply("nope")')).rejects.toThrow('nope');
  });
  it('hands command replies to scripts as Redis does: nil as false, status as {ok=}', async () => {
    expect(await ev('return redis.call("GET", "missing") == false')).toBe(1);
    expect(await ev('return redis.call("SET", KEYS[1], "v")["ok"]', ['k'])).toBe('OK');
    expect(await ev('return redis.pcall("NOSUCH")["err"] ~= nil')).toBe(1);
  });
  it('does not leak globals between calls', async () => {
    await ev('leaked = 42 return 1');
    expect(await ev('return tostring(leaked)')).toBe('nil');
  });
});

describe('cjson and cmsgpack', () => {
  it('round-trips JSON with null and nested arrays', async () => {
    expect(
      await ev(
        'local t = cjson.decode(ARGV[1]) return {t.a, t.b[2], tostring(t.c == cjson.null)}',
        [],
        ['{"a":1700000000001,"b":[1,2],"c":null}'],
      ),
    ).toEqual([1700000000001, 2, 'true']);
    expect(JSON.parse(await ev('return cjson.encode({a=1.5, b={1,2,3}, c={}})'))).toEqual({
      a: 1.5,
      b: [1, 2, 3],
      c: {},
    });
  });
  it('unpacks msgpack Buffers given as arguments', async () => {
    // {"a":1,"b":"hi","ts":1700000000000.0} encoded by hand per the msgpack spec:
    // fixmap(3), fixstr keys, positive fixint, fixstr, float64.
    const ts = Buffer.alloc(8);
    ts.writeDoubleBE(1700000000000);
    const packed = Buffer.concat([Buffer.from('83a16101a162a26869a27473cb', 'hex'), ts]);
    expect(await ev('local t = cmsgpack.unpack(ARGV[1]) return {t.a, t.b, tostring(t.ts)}', [], [packed])).toEqual([
      1,
      'hi',
      '1700000000000',
    ]);
  });
});

describe('added commands', () => {
  it('CLIENT SETNAME/GETNAME and LIST', async () => {
    await r.client('SETNAME', 'spec-conn');
    expect(await r.client('GETNAME')).toBe('spec-conn');
    expect(await other.client('LIST')).toContain('name=spec-conn');
  });
  it('XADD ids increase and XREAD BLOCK wakes on a new entry', async () => {
    const a = await r.xadd('s', '*', 'f', '1');
    const b = await r.xadd('s', '*', 'f', '2');
    expect(a).toMatch(/^\d+-\d+$/);
    const [ams, aseq] = a.split('-').map(Number);
    const [bms, bseq] = b.split('-').map(Number);
    expect(bms > ams || (bms === ams && bseq > aseq)).toBe(true);
    const blocked = other.xread('BLOCK', 5000, 'STREAMS', 's', '$');
    await r.xadd('s', '*', 'f', '3');
    const got = await blocked;
    expect(got[0][0]).toBe('s');
    expect(got[0][1][0][1]).toEqual(['f', '3']);
    expect(await r.xtrim('s', 'MAXLEN', '1')).toBe(2);
    expect(await r.xlen('s')).toBe(1);
    expect(await r.type('s')).toBe('stream');
  });
  it('XREAD BLOCK times out with null', async () => {
    expect(await other.xread('BLOCK', 50, 'STREAMS', 'quiet', '$')).toBeNull();
  });
  it('BZPOPMIN blocks until a member is added', async () => {
    const blocked = other.bzpopmin('z', 5);
    await r.zadd('z', 7, 'm');
    expect(await blocked).toEqual(['z', 'm', '7']);
    expect(await other.bzpopmin('z', 0.05)).toBeNull();
  });
  it('ZLEXCOUNT counts a lexical range', async () => {
    await r.zadd('lex', 0, 'a', 0, 'b', 0, 'c', 0, 'd');
    expect(await r.zlexcount('lex', '-', '+')).toBe(4);
    expect(await r.zlexcount('lex', '[b', '(d')).toBe(2);
  });
  it('pipelines run overridden commands and scripts', async () => {
    const res = await r.pipeline().xadd('p', '*', 'k', 'v').xlen('p').exec();
    expect(res[1]).toEqual([null, 1]);
  });
  it('identifies embedded connections', () => {
    expect(isEmbeddedRedis(r)).toBe(true);
    expect(isEmbeddedRedis({})).toBe(false);
  });
  it('rejects a pending blocking read on disconnect', async () => {
    const c: any = r.duplicate();
    const pending = c.bzpopmin('never', 0);
    c.disconnect();
    await expect(pending).rejects.toThrow('Connection is closed.');
  });
});
