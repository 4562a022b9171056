/**
 * Temporary storage for the symbolic phase, carved from one Int32Array as a stack: `take` hands
 * out the next free stretch, `release` gives back everything taken after a `mark`. A sequence of
 * phases that each need a few temporary vectors then reuses one allocation, instead of leaving
 * dozens of large typed arrays for the garbage collector (their memory is held until a
 * collection runs, which raises the peak of whatever comes next).
 *
 * Stretches are not cleared: whoever takes one initialises it (`zeros` and `filled` do). When
 * the buffer cannot hold a request, `take` returns a fresh array instead, so a scratch that is
 * too small (or empty) only costs allocations, never correctness.
 */
export class Scratch {
  private top = 0;

  /** @param buffer - storage to carve; none (the default) makes every request a fresh array */
  constructor(private readonly buffer: Int32Array = new Int32Array(0)) {}

  /** A scratch of `length` Int32 entries. */
  static ofLength(length: number): Scratch {
    return new Scratch(new Int32Array(length));
  }

  /** Position to give back to with {@link release}. */
  mark(): number {
    return this.top;
  }

  /** Gives back every stretch taken since `mark` was read; those views must not be used again. */
  release(mark: number): void {
    this.top = mark;
  }

  /** `length` entries, contents undefined. */
  take(length: number): Int32Array {
    const end = this.top + length;
    if (end > this.buffer.length) return new Int32Array(length);
    const view = this.buffer.subarray(this.top, end);
    this.top = end;
    return view;
  }

  /** `length` entries set to 0. */
  zeros(length: number): Int32Array {
    return this.take(length).fill(0);
  }

  /** `length` entries set to `value`. */
  filled(length: number, value: number): Int32Array {
    return this.take(length).fill(value);
  }

  /** `length` Float64 entries set to 0, on 8-byte aligned storage of the same buffer. */
  float64Zeros(length: number): Float64Array {
    const m = this.top;
    const skip = (this.buffer.byteOffset + 4 * m) % 8 === 0 ? 0 : 1;
    const end = m + skip + 2 * length;
    if (end > this.buffer.length) return new Float64Array(length);
    this.top = end;
    return new Float64Array(this.buffer.buffer, this.buffer.byteOffset + 4 * (m + skip), length).fill(0);
  }
}

/** Int32 entries that {@link Scratch.float64Zeros} takes for `length` values (alignment included). */
export function float64Entries(length: number): number {
  return 2 * length + 1;
}
