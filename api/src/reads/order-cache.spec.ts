import { describe, expect, it } from 'vitest';
import { covers, OrderCache, orderKey } from './order-cache.js';

const order = (n: number) => new Uint32Array(n);

describe('OrderCache (sorted orders, least recently used dropped first, bounded by bytes)', () => {
  it('keeps entries within the byte budget and drops the least recently used', () => {
    const c = new OrderCache(100 * 4);
    c.set('a', order(40));
    c.set('b', order(40));
    expect(c.get('a')).toBeDefined(); // a is now more recent than b
    c.set('c', order(40)); // 120 words > 100: b goes
    expect(c.get('b')).toBeUndefined();
    expect(c.get('a')).toBeDefined();
    expect(c.get('c')).toBeDefined();
    expect(c.usedBytes).toBe(80 * 4);
    expect(c.size).toBe(2);
  });

  it('replaces a leading part by a longer order under the same key without counting it twice', () => {
    const c = new OrderCache(1000);
    c.set('a', order(50), 100);
    expect(c.get('a')).toMatchObject({ total: 100 });
    c.set('a', order(100));
    expect(c.usedBytes).toBe(400);
    expect(c.get('a')!.order.length).toBe(100);
    // A later leading part (another first page of the same view) keeps the whole order.
    c.set('a', order(20), 100);
    expect(c.get('a')!.order.length).toBe(100);
    expect(c.usedBytes).toBe(400);
  });

  it('answers a page from a leading part only inside it, and any page from a whole order', () => {
    const part = { order: order(60), total: 1000 };
    expect(covers(part, 0, 50)).toBe(true);
    expect(covers(part, 10, 50)).toBe(true);
    expect(covers(part, 50, 50)).toBe(false);
    const whole = { order: order(120), total: 120 };
    expect(covers(whole, 100, 50)).toBe(true); // the short last page
    expect(covers(whole, 500, 50)).toBe(true); // past the end: an empty page
  });

  it('never stores an order larger than the whole budget (and a zero budget stores nothing)', () => {
    const c = new OrderCache(100);
    c.set('small', order(10));
    c.set('huge', order(1000));
    expect(c.get('huge')).toBeUndefined();
    expect(c.get('small')).toBeDefined();
    const off = new OrderCache(0);
    off.set('x', order(1));
    expect(off.size).toBe(0);
  });

  it('keys differ with the sweep state, column, direction and filter, not with filter key order', () => {
    const s = { id: 7, pointsDone: 1000, finishedAt: 123 };
    const k = orderKey(s, 'vE_ms', true, { a: { gte: 1, lte: 2 }, b: { eq: true } });
    expect(orderKey(s, 'vE_ms', true, { b: { eq: true }, a: { lte: 2, gte: 1 } })).toBe(k);
    expect(orderKey(s, 'vE_ms', false, { a: { gte: 1, lte: 2 }, b: { eq: true } })).not.toBe(k);
    expect(orderKey(s, 'vDi_ms', true, { a: { gte: 1, lte: 2 }, b: { eq: true } })).not.toBe(k);
    expect(orderKey({ ...s, pointsDone: 999 }, 'vE_ms', true, { a: { gte: 1, lte: 2 }, b: { eq: true } })).not.toBe(k);
    expect(orderKey(s, 'vE_ms', true, {})).not.toBe(k);
  });
});
