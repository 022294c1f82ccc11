import { describe, expect, it } from 'vitest';
import { WindowCounter } from './window-counter.ts';

describe('WindowCounter', () => {
  it('when a key reaches its limit, then the next event is over it until the window ends', () => {
    let now = 60_000 * 1000 + 5_000;
    const c = new WindowCounter(3, 60_000, () => now);
    expect([1, 2, 3].map(() => c.hit('a').exceeded)).toEqual([false, false, false]);
    expect(c.isExhausted('a')).toBe(true);
    expect(c.isExhausted('b')).toBe(false);
    const over = c.hit('a');
    expect(over).toMatchObject({ limit: 3, count: 4, remaining: 0, exceeded: true, resetS: 55 });
    now += 55_000; // the next aligned window
    expect(c.isExhausted('a')).toBe(false);
    expect(c.hit('a')).toMatchObject({ count: 1, remaining: 2, resetS: 60 });
  });

  it('when peeked, then nothing is counted and exceeded says whether one more would be over', () => {
    const c = new WindowCounter(1, 60_000, () => 0);
    expect(c.peek('a')).toMatchObject({ count: 0, remaining: 1, exceeded: false });
    c.hit('a');
    expect(c.peek('a')).toMatchObject({ count: 1, remaining: 0, exceeded: true });
  });

  it('when more distinct keys than allowed arrive in one window, then the counts are dropped rather than grow', () => {
    const c = new WindowCounter(1, 60_000, () => 0, 3);
    for (const k of ['a', 'b', 'c']) c.hit(k);
    expect(c.isExhausted('a')).toBe(true);
    c.hit('d');
    expect(c.isExhausted('a')).toBe(false);
    expect(c.isExhausted('d')).toBe(true);
  });
});
