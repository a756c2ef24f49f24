/**
 * Numbered scratch arrays reused from call to call, for a function that writes every value before it
 * reads it and hands none of them out: the large per-call arrays of the daily fits then cost no
 * allocation (nor zero-filling, nor garbage collection) after the first call.
 */
export class ScratchBuffers {
  private readonly buffers: Float64Array[] = [];

  /**
   * Array `which`, a view exactly `length` long, grown (its contents not kept) when too short: by a
   * quarter at least, so that a length growing a little from call to call (the driver fits' windows
   * filling up day by day) does not allocate on every call.
   */
  get(which: number, length: number): Float64Array {
    let buffer = this.buffers[which];
    if (buffer === undefined || buffer.length < length) {
      buffer = new Float64Array(Math.max(length, Math.ceil(1.25 * (buffer?.length ?? 0))));
      this.buffers[which] = buffer;
    }
    return buffer.subarray(0, length);
  }
}
