/**
 * The lower-triangular Cholesky factor L of a symmetric matrix (L·Lᵀ = C), or null when C is
 * not positive definite (a set of correlations that cannot hold together).
 *
 * @example cholesky([[1, 0.5], [0.5, 1]]) // → [[1, 0], [0.5, 0.866…]]
 */
export function cholesky(c: readonly (readonly number[])[]): number[][] | null {
  const n = c.length;
  const l = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = c[i][j];
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k];
      if (i === j) {
        if (!(s > 1e-12)) return null;
        l[i][i] = Math.sqrt(s);
      } else l[i][j] = s / l[j][j];
    }
  }
  return l;
}
