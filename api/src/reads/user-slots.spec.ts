import { afterEach, describe, expect, it, vi } from 'vitest';
import { ReadLimitError } from './read-errors.js';
import { UserSlots } from './user-slots.js';

describe('UserSlots (per-user cap on concurrent heavy reads)', () => {
  afterEach(() => vi.useRealTimers());

  it('grants up to the cap at once, per user', async () => {
    const s = new UserSlots(2, 1000);
    await s.acquire(1);
    await s.acquire(1);
    await s.acquire(2);
    expect(s.active(1)).toBe(2);
    expect(s.active(2)).toBe(1);
  });

  it('hands a released slot to the next waiting read of the same user', async () => {
    const s = new UserSlots(1, 1000);
    const release = await s.acquire(1);
    let granted = false;
    const next = s.acquire(1).then((r) => {
      granted = true;
      return r;
    });
    await Promise.resolve();
    expect(granted).toBe(false);
    release();
    release(); // a second call is ignored
    (await next)();
    expect(granted).toBe(true);
    expect(s.active(1)).toBe(0);
  });

  it('refuses an excess read with a ReadLimitError after the wait', async () => {
    vi.useFakeTimers();
    const s = new UserSlots(1, 500);
    await s.acquire(9);
    const p = s.acquire(9);
    const check = expect(p).rejects.toBeInstanceOf(ReadLimitError);
    await vi.advanceTimersByTimeAsync(501);
    await check;
    expect(s.active(9)).toBe(1);
  });

  it('drops a waiting read whose client went away, without taking a slot', async () => {
    const s = new UserSlots(1, 10_000);
    const release = await s.acquire(3);
    const ac = new AbortController();
    const p = s.acquire(3, ac.signal);
    ac.abort(new Error('client disconnected'));
    await expect(p).rejects.toThrow(/client disconnected/);
    release();
    expect(s.active(3)).toBe(0);
  });
});
