// Reusable work arrays of the findings engine. A check of 100,000 placements needs some 15 typed
// arrays of that length; allocating them afresh on every run makes the garbage collector run
// full collections in a worker that checks again and again. The arrays handed out here are valid
// until the next check starts (the engine is synchronous, so runs never interleave); results never
// point into them.

const f64 = new Map<string, ArrayBuffer>();
const i32 = new Map<string, ArrayBuffer>();

function buffer(pool: Map<string, ArrayBuffer>, name: string, bytes: number): ArrayBuffer {
  let b = pool.get(name);
  if (!b || b.byteLength < bytes) {
    // grow by a quarter more than asked, so slowly growing inputs do not reallocate every run
    b = new ArrayBuffer(Math.max(64, Math.ceil((bytes * 1.25) / 8) * 8));
    pool.set(name, b);
  }
  return b;
}

/** A Float64Array of length n (contents left from an earlier run: write before reading). */
export function scratchF64(name: string, n: number): Float64Array {
  return new Float64Array(buffer(f64, name, 8 * n), 0, n);
}

/** An Int32Array of length n (contents left from an earlier run: write before reading). */
export function scratchI32(name: string, n: number): Int32Array {
  return new Int32Array(buffer(i32, name, 4 * n), 0, n);
}

/** Drop the work arrays (e.g. after a very large check, to give the memory back). */
export function releaseVerifyScratch(): void {
  f64.clear();
  i32.clear();
}
