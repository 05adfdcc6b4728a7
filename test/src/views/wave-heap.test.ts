import { describe, expect, it } from 'vitest';
import { WaveHeap } from '../../../src/views/wave-heap.js';

describe('WaveHeap', () => {
  it('gives the waves back in order of launch time, whatever order they came in', () => {
    const heap = new WaveHeap<{ t0: number; id: number }>();
    const times = [5, 1, 4, 1.5, 9, 2, 6, 0, 3];
    times.forEach((t0, id) => heap.push({ t0, id }));
    expect(heap.size).toBe(times.length);
    const out: number[] = [];
    for (let w = heap.pop(); w; w = heap.pop()) out.push(w.t0);
    expect(out).toEqual([...times].sort((x, y) => x - y));
    expect(heap.pop()).toBeUndefined();
  });
});
