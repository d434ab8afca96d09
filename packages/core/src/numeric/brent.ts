/** Outcome of a root search. */
export interface RootResult {
  x: number;
  converged: boolean;
  iterations: number;
}

/**
 * Brent's method (Brent 1973, "Algorithms for Minimization without Derivatives", ch. 4):
 * a root of f in [a, b] where f(a) and f(b) differ in sign, by inverse quadratic
 * interpolation safeguarded by bisection. Never leaves the bracket.
 *
 * @example brent((x) => x * x - 2, 0, 2).x // → 1.41421356…
 */
export function brent(
  f: (x: number) => number,
  a: number,
  b: number,
  tol = 1e-10,
  maxIterations = 100,
  fa0?: number,
  fb0?: number,
): RootResult {
  let fa = fa0 ?? f(a);
  let fb = fb0 ?? f(b);
  if (fa === 0) return { x: a, converged: true, iterations: 0 };
  if (fb === 0) return { x: b, converged: true, iterations: 0 };
  if (!(fa * fb < 0)) return { x: NaN, converged: false, iterations: 0 };
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 1; it <= maxIterations; it++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol1 || fb === 0) return { x: b, converged: true, iterations: it };
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = d;
      }
    } else {
      d = m;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : m > 0 ? tol1 : -tol1;
    fb = f(b);
  }
  return { x: b, converged: false, iterations: maxIterations };
}
