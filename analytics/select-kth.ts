function swap(values: Float64Array, i: number, j: number): void {
  const held = values[i];
  values[i] = values[j];
  values[j] = held;
}

/**
 * Rearranges `values[left..right]` in place so that `values[k]` holds the value it
 * would have if that range were sorted, with nothing larger before it and nothing
 * smaller after it. Floyd RW, Rivest RL, "Algorithm 489: SELECT", Commun ACM
 * 1975;18(3):173: expected linear time, with sampling to choose good pivots on
 * large ranges; Hoare-style partitioning keeps many equal values (0.5 mm readings)
 * balanced. Used for medians and quartiles, where a full sort costs n log n.
 *
 * @param values the array, rearranged in place (no NaN)
 * @param k the 0-based rank wanted, left ≤ k ≤ right
 * @param left first index of the range (default 0)
 * @param right last index of the range (default values.length − 1)
 * @example
 * const v = Float64Array.of(5, 1, 4, 2, 3);
 * selectKth(v, 2); // v[2] === 3
 */
export function selectKth(values: Float64Array, k: number, left = 0, right = values.length - 1): void {
  while (right > left) {
    if (right - left > 600) {
      // Recurse on a sample around k to bring a near-k pivot into place first.
      const n = right - left + 1;
      const m = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (m - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (m * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - m) * s) / n + sd));
      selectKth(values, k, newLeft, newRight);
    }
    const pivot = values[k];
    let i = left;
    let j = right;
    swap(values, left, k);
    if (values[right] > pivot) swap(values, left, right);
    while (i < j) {
      swap(values, i, j);
      i++;
      j--;
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
    }
    if (values[left] === pivot) {
      swap(values, left, j);
    } else {
      j++;
      swap(values, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}
