/**
 * Growing the typed-array buffers the engine keeps per iteration: a copy at twice the length, so appends stay
 * amortised O(1) without per-element objects.
 */
export function doubledF64(a: Float64Array): Float64Array {
  const out = new Float64Array(2 * a.length);
  out.set(a);
  return out;
}

export function doubledI32(a: Int32Array): Int32Array {
  const out = new Int32Array(2 * a.length);
  out.set(a);
  return out;
}
