/**
 * Where a key moves the focus in a row of `n` items that is one tab stop (the stations of the
 * chart, the lines of the plan): the arrows step to the next or previous item, Home and End
 * jump to the first and the last; null for any other key.
 */
export function steppedIndex(key: string, i: number, n: number): number | null {
  switch (key) {
    case 'ArrowRight':
    case 'ArrowDown':
      return Math.min(n - 1, i + 1);
    case 'ArrowLeft':
    case 'ArrowUp':
      return Math.max(0, i - 1);
    case 'Home':
      return 0;
    case 'End':
      return n - 1;
    default:
      return null;
  }
}
