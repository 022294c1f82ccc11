/**
 * Counts events per key in fixed windows aligned to the clock (the window of a moment is
 * floor(t / windowMs)), in this process's memory. Only the current window is kept: when the clock
 * enters the next window the whole map is replaced, so memory is bounded by the keys seen in one window
 * and no sweeping is needed. A map that grows beyond `maxKeys` within one window (a flood of distinct
 * keys) is cleared: the guard fails open rather than grow without bound.
 */
export interface WindowState {
  /** The policy's quota per window. */
  limit: number;
  /** Events counted for this key in the current window. */
  count: number;
  remaining: number;
  /** Seconds until the current window ends. */
  resetS: number;
  exceeded: boolean;
}

export class WindowCounter {
  private windowStartMs = 0;
  private counts = new Map<string, number>();

  constructor(
    readonly limit: number,
    readonly windowMs: number = 60_000,
    private readonly clock: () => number = Date.now,
    private readonly maxKeys: number = 100_000,
  ) {}

  private roll(now: number): void {
    const start = now - (now % this.windowMs);
    if (start !== this.windowStartMs) {
      this.windowStartMs = start;
      this.counts = new Map();
    }
  }

  private state(count: number, now: number): WindowState {
    return {
      limit: this.limit,
      count,
      remaining: Math.max(0, this.limit - count),
      resetS: Math.max(1, Math.ceil((this.windowStartMs + this.windowMs - now) / 1000)),
      exceeded: count > this.limit,
    };
  }

  /** The key's state without counting; `exceeded` when the next event would be over the limit. */
  peek(key: string): WindowState {
    const now = this.clock();
    this.roll(now);
    const count = this.counts.get(key) ?? 0;
    return { ...this.state(count, now), exceeded: count >= this.limit };
  }

  /** True when the key has used its whole quota in this window (cheap: one map lookup). */
  isExhausted(key: string): boolean {
    this.roll(this.clock());
    return (this.counts.get(key) ?? 0) >= this.limit;
  }

  /** Counts one event; `exceeded` when this event is over the limit. */
  hit(key: string): WindowState {
    const now = this.clock();
    this.roll(now);
    if (this.counts.size >= this.maxKeys && !this.counts.has(key)) this.counts = new Map();
    const count = (this.counts.get(key) ?? 0) + 1;
    this.counts.set(key, count);
    return this.state(count, now);
  }
}
