// A binary min-heap of waves keyed by launch time, shared by the chain and the tree lattices.

/** Waves in order of their launch time `t0`: `pop` always gives the earliest one left. */
export class WaveHeap<T extends { t0: number }> {
  private readonly a: T[] = [];
  get size(): number {
    return this.a.length;
  }
  push(w: T): void {
    const a = this.a;
    a.push(w);
    for (let i = a.length - 1; i > 0; ) {
      const p = (i - 1) >> 1;
      if (a[p].t0 <= a[i].t0) break;
      [a[p], a[i]] = [a[i], a[p]];
      i = p;
    }
  }
  pop(): T | undefined {
    const a = this.a;
    if (a.length === 0) return undefined;
    const top = a[0];
    const last = a.pop()!;
    if (a.length > 0) {
      a[0] = last;
      for (let i = 0; ; ) {
        const l = 2 * i + 1, r = l + 1;
        let m = i;
        if (l < a.length && a[l].t0 < a[m].t0) m = l;
        if (r < a.length && a[r].t0 < a[m].t0) m = r;
        if (m === i) break;
        [a[m], a[i]] = [a[i], a[m]];
        i = m;
      }
    }
    return top;
  }
}
