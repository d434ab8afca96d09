/**
 * Round tick values from lo to hi, about `count` of them, a step of 1, 2 or 5 times a power
 * of ten apart (the usual choice of engineering plots), rounded so that no value prints as
 * 0.30000000000000004.
 *
 * @example niceTicks(0, 47, 5) // → [0, 10, 20, 30, 40]
 */
export function niceTicks(lo: number, hi: number, count = 8): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || hi < lo) return [];
  if (hi === lo) return [lo];
  const raw = (hi - lo) / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) {
    out.push(Number(v.toFixed(decimals)));
  }
  return out;
}
