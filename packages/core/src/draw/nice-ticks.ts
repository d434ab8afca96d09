/**
 * The round step at or above `raw` (raw > 0): 1, 2 or 5 times a power of ten (the usual
 * choice of engineering plots). 1 for a step that is not a positive finite number.
 *
 * @example niceStep(9.4) // → 10
 */
export function niceStep(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  return [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
}

/**
 * Round tick values from lo to hi, about `count` of them, `niceStep` apart, rounded so that no
 * value prints as 0.30000000000000004.
 *
 * @example niceTicks(0, 47, 5) // → [0, 10, 20, 30, 40]
 */
export function niceTicks(lo: number, hi: number, count = 8): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || hi < lo) return [];
  if (hi === lo) return [lo];
  const step = niceStep((hi - lo) / Math.max(1, count));
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) {
    out.push(Number(v.toFixed(decimals)));
  }
  return out;
}
