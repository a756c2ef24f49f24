import { describe, expect, it } from 'vitest';
import { ScratchBuffers } from '../../src/forecast/scratchBuffers.js';

describe('ScratchBuffers', () => {
  it('hands out views exactly as long as asked, the same array again while it is long enough', () => {
    const scratch = new ScratchBuffers();
    const first = scratch.get(0, 100);
    expect(first.length).toBe(100);
    const shorter = scratch.get(0, 40);
    expect(shorter.length).toBe(40);
    expect(shorter.buffer).toBe(first.buffer);
    // Another number is another array.
    expect(scratch.get(1, 40).buffer).not.toBe(first.buffer);
  });

  it('grows by a quarter at least, so that a length growing by one does not allocate every time', () => {
    const scratch = new ScratchBuffers();
    const buffers = new Set<ArrayBufferLike>();
    for (let length = 1000; length <= 1100; length++) buffers.add(scratch.get(0, length).buffer);
    // 1000, then 1250 (a quarter more) covers every length up to 1100: two arrays, not 101.
    expect(buffers.size).toBe(2);
    expect(scratch.get(0, 1100).buffer.byteLength).toBe(1250 * 8);
    // A jump beyond a quarter takes the length asked.
    expect(scratch.get(0, 5000).buffer.byteLength).toBe(5000 * 8);
  });
});
