/**
 * A list of numbers that keeps its storage from use to use (a JS array emptied with
 * `length = 0` gives its storage back, so refilling it allocates again): the slicer's
 * scratch lists of edges and crossings.
 */
export class NumberList {
  values: Float64Array;
  length = 0;

  constructor(capacity = 16) {
    this.values = new Float64Array(capacity);
  }

  clear(): void {
    this.length = 0;
  }

  push(x: number): void {
    if (this.length === this.values.length) {
      const grown = new Float64Array(2 * this.values.length);
      grown.set(this.values);
      this.values = grown;
    }
    this.values[this.length++] = x;
  }

  /** Sort ascending in place (insertion sort: the lists are short and mostly ordered). */
  sort(): void {
    const v = this.values;
    for (let i = 1; i < this.length; i++) {
      const x = v[i];
      let j = i - 1;
      while (j >= 0 && v[j] > x) {
        v[j + 1] = v[j];
        j--;
      }
      v[j + 1] = x;
    }
  }

  /** Sort, then merge values closer than tol to the one before. */
  sortUnique(tol: number): void {
    this.sort();
    const v = this.values;
    let m = 0;
    for (let i = 0; i < this.length; i++) if (m === 0 || v[i] - v[m - 1] > tol) v[m++] = v[i];
    this.length = m;
  }

  toArray(): number[] {
    return Array.from(this.values.subarray(0, this.length));
  }
}
