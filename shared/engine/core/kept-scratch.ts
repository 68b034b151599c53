/**
 * A scratch array of doubles kept between calls, for a reader that fills it and is done with
 * it before its next call: repeated analyses of one sweep length allocate nothing. An array
 * longer than `maxKept` is handed out but not kept (a one-off long sweep should not pin its
 * memory).
 */
export function keptScratch(maxKept: number): (length: number) => Float64Array {
  let kept = new Float64Array(0);
  return (length) => {
    if (kept.length === length) return kept;
    const fresh = new Float64Array(length);
    if (length <= maxKept) kept = fresh;
    return fresh;
  };
}
