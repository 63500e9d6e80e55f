/**
 * Reusable storage for an engine computation's internal work arrays.
 *
 * Every Float64Array made with `new` gets storage outside the JavaScript heap, which V8 allocates,
 * zeroes and registers with the collector: about 1.5 to 3.5 µs each on the benchmark machine, against
 * about 0.1 µs for a zeroed view into a buffer that exists. An analysis of 2 × 300 stations made a dozen
 * of them, some 10 % of its time (issue 15). A Scratch hands out zeroed views of one buffer instead,
 * kept from one computation to the next. Views stay valid until the owner's next `reset`, so nothing
 * that leaves the computation (a result) may point into one; the computations that use it are
 * synchronous and do not call themselves, and each JavaScript realm (a worker thread, the page) has its
 * own module instance.
 */
export class Scratch {
  private buffer = new Float64Array(0);
  private used = 0;

  /** `retainedLength`: the largest buffer kept between computations (doubles); beyond it, views are fresh arrays. */
  constructor(private readonly retainedLength: number) {}

  /** Start a computation: every view handed out before may be handed out again. */
  reset(): void {
    this.used = 0;
  }

  /** `length` doubles, all zero, as a fresh Float64Array would be. */
  take(length: number): Float64Array {
    if (this.used + length > this.buffer.length) {
      const size = Math.max(2 * this.buffer.length, 2 * length, 1024);
      if (size > this.retainedLength) return new Float64Array(length);
      // Views handed out earlier keep the old buffer alive as long as they are in use.
      this.buffer = new Float64Array(size);
      this.used = 0;
    }
    const view = this.buffer.subarray(this.used, this.used + length);
    this.used += length;
    view.fill(0);
    return view;
  }
}
