/**
 * The engine's timers: a binary heap ordered by (due, seq), so timers due at the
 * same millisecond fire in the order they were set. Each timer has a key; setting
 * a key again replaces it. Replaced and cancelled entries stay in the heap until
 * they surface (cheaper than searching), and the heap is compacted when they pile up.
 */
export type TimerPayload =
  | { kind: "schedule"; triggerKey: string }
  | { kind: "named"; name: string }
  | { kind: "vacancy"; triggerKey: string; device: string }
  | { kind: "left-open"; triggerKey: string; device: string }
  | { kind: "occupancy"; device: string }
  | { kind: "relay-off"; device: string }
  | { kind: "hold-end"; zone: string };

export type TimerEntry = { due: number; seq: number; key: string; payload: TimerPayload };

export class TimerQueue {
  private heap: TimerEntry[] = [];
  private live = new Map<string, TimerEntry>();
  private nextSeq: number;

  constructor(entries: TimerEntry[] = [], nextSeq = 0) {
    this.nextSeq = nextSeq;
    for (const e of entries) this.insert({ ...e });
  }

  set(key: string, due: number, payload: TimerPayload): TimerEntry {
    const entry = { due, seq: this.nextSeq++, key, payload };
    this.insert(entry);
    return entry;
  }

  cancel(key: string): boolean {
    return this.live.delete(key);
  }

  get(key: string): TimerEntry | undefined {
    return this.live.get(key);
  }

  /** Removes and returns the earliest live timer due at or before `limit`. */
  popDue(limit: number): TimerEntry | null {
    while (this.heap.length > 0) {
      const top = this.heap[0];
      if (this.live.get(top.key) !== top) {
        this.popTop();
        continue;
      }
      if (top.due > limit) return null;
      this.popTop();
      this.live.delete(top.key);
      return top;
    }
    return null;
  }

  get size(): number {
    return this.live.size;
  }

  /** Live timers in firing order: the serialised form. */
  toJSON(): { nextSeq: number; entries: TimerEntry[] } {
    const entries = [...this.live.values()].sort(compare).map((e) => ({ ...e, payload: { ...e.payload } }));
    return { nextSeq: this.nextSeq, entries };
  }

  private insert(entry: TimerEntry) {
    this.live.set(entry.key, entry);
    this.heap.push(entry);
    this.siftUp(this.heap.length - 1);
    if (this.heap.length > 64 && this.heap.length > 4 * this.live.size) this.compact();
  }

  private compact() {
    this.heap = [...this.live.values()].sort(compare);
  }

  private popTop() {
    const last = this.heap.pop()!;
    if (this.heap.length > 0) {
      this.heap[0] = last;
      this.siftDown(0);
    }
  }

  private siftUp(i: number) {
    const h = this.heap;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (compare(h[i], h[parent]) >= 0) return;
      const t = h[i];
      h[i] = h[parent];
      h[parent] = t;
      i = parent;
    }
  }

  private siftDown(i: number) {
    const h = this.heap;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < h.length && compare(h[l], h[m]) < 0) m = l;
      if (r < h.length && compare(h[r], h[m]) < 0) m = r;
      if (m === i) return;
      const t = h[i];
      h[i] = h[m];
      h[m] = t;
      i = m;
    }
  }
}

function compare(a: TimerEntry, b: TimerEntry): number {
  return a.due - b.due || a.seq - b.seq;
}
