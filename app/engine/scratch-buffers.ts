/**
 * Reusable Float64Array work space for the array paths (angle evaluation, hashing of number
 * lists). Freshly allocated memory costs a page fault per page on first touch — measured
 * 25–35 ms per 8 MB on the virtual machines the project runs on, more than evaluating 10⁶
 * angles — so the work arrays are kept and grown instead of allocated per request. Holds at
 * most SLOTS × MAX_KEPT × 8 bytes (48 MB); larger requests get fresh arrays.
 * Safe because every user is synchronous and none calls back into code that could use the
 * same slot before it has finished with it.
 */
const MAX_KEPT = 2 ** 21;
const kept: Float64Array[] = [new Float64Array(0), new Float64Array(0), new Float64Array(0)];

export const SCRATCH_COS = 0;
export const SCRATCH_VALUES = 1;
export const SCRATCH_HASH = 2;

/** A work array of length n in `slot` (its contents are left over from earlier use). */
export function scratchFloat64(slot: number, n: number): Float64Array {
  if (n > MAX_KEPT) return new Float64Array(n);
  if (kept[slot].length < n) kept[slot] = new Float64Array(Math.max(n, 2 * kept[slot].length));
  return kept[slot].subarray(0, n);
}
