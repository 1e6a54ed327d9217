/**
 * The crew's pace: the median time between a study's entries, leaving out breaks longer than 10 minutes
 * (lunch, walking to the next site). A running median over two heaps: O(log n) per entry.
 * This is timing for the "about T at your pace" line, not a statistic of the study's data.
 */
export const BREAK_MS = 10 * 60 * 1000;
/** Gaps needed before a pace is shown. */
export const MIN_GAPS = 5;

class Heap {
  a: number[] = [];
  constructor(private readonly before: (x: number, y: number) => boolean) {}
  get size(): number {
    return this.a.length;
  }
  peek(): number {
    return this.a[0] as number;
  }
  push(x: number): void {
    const a = this.a;
    a.push(x);
    let i = a.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.before(a[i] as number, a[p] as number)) break;
      [a[i], a[p]] = [a[p] as number, a[i] as number];
      i = p;
    }
  }
  pop(): number {
    const a = this.a;
    const top = a[0] as number;
    const last = a.pop() as number;
    if (a.length > 0) {
      a[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < a.length && this.before(a[l] as number, a[m] as number)) m = l;
        if (r < a.length && this.before(a[r] as number, a[m] as number)) m = r;
        if (m === i) break;
        [a[i], a[m]] = [a[m] as number, a[i] as number];
        i = m;
      }
    }
    return top;
  }
}

export class Pace {
  private low = new Heap((x, y) => x > y);
  private high = new Heap((x, y) => x < y);
  private last: number | undefined;

  /** The two heaps and the last time, as plain data (the running snapshot stores it). */
  state(): { low: number[]; high: number[]; last: number | null } {
    return { low: [...this.low.a], high: [...this.high.a], last: this.last ?? null };
  }

  /** A pace from `state()`; null when the data are not one (the caller then rebuilds from the log). */
  static restore(x: unknown): Pace | null {
    if (typeof x !== 'object' || x === null) return null;
    const s = x as { low?: unknown; high?: unknown; last?: unknown };
    const ok = (a: unknown): a is number[] => Array.isArray(a) && a.every((g) => Number.isFinite(g));
    if (!ok(s.low) || !ok(s.high) || !(s.last === null || Number.isFinite(s.last))) return null;
    if (s.low.length < s.high.length || s.low.length > s.high.length + 1) return null;
    const p = new Pace();
    p.low.a = [...s.low];
    p.high.a = [...s.high];
    p.last = (s.last as number | null) ?? undefined;
    return p;
  }

  /** Feed entry times (ms) in order. */
  addEntryTime(ms: number): void {
    if (this.last !== undefined) {
      const gap = ms - this.last;
      if (gap >= 0 && gap <= BREAK_MS) this.addGap(gap);
    }
    this.last = ms;
  }
  private addGap(g: number): void {
    if (this.low.size === 0 || g <= this.low.peek()) this.low.push(g);
    else this.high.push(g);
    if (this.low.size > this.high.size + 1) this.high.push(this.low.pop());
    else if (this.high.size > this.low.size) this.low.push(this.high.pop());
  }
  get gaps(): number {
    return this.low.size + this.high.size;
  }
  /** Median gap in ms, or null while there are fewer than MIN_GAPS gaps. */
  get medianMs(): number | null {
    if (this.gaps < MIN_GAPS) return null;
    return this.low.size > this.high.size ? this.low.peek() : (this.low.peek() + this.high.peek()) / 2;
  }
}

/** "about 40 s", "about 7 min", "about 1 h 20 min". */
export function formatDuration(ms: number): string {
  const s = Math.max(1, Math.round(ms / 1000));
  if (s < 90) return `${s} s`;
  const min = Math.round(s / 60);
  if (min < 60) return `${min} min`;
  const h = Math.floor(min / 60);
  const m = min % 60;
  return m ? `${h} h ${m} min` : `${h} h`;
}
