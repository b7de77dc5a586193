/**
 * Splits request indexes into runs of consecutive values, as [from, to) positions in the array:
 * [5, 6, 7, 2, 3, 9] gives [0, 3], [3, 5], [5, 6]. Each run can be scored with one first index.
 */
export function contiguousRuns(indexes: ArrayLike<number>): Array<[number, number]> {
  const runs: Array<[number, number]> = [];
  let from = 0;
  for (let k = 1; k <= indexes.length; k++) {
    if (k === indexes.length || indexes[k] !== indexes[k - 1] + 1) {
      if (k > from) runs.push([from, k]);
      from = k;
    }
  }
  return runs;
}
