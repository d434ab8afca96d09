/**
 * The distributions of the random variables: each one's value at a standard normal score z
 * (the score through Φ to a probability, then the inverse CDF), its mean and SD, and the range
 * a sensitivity plot spans. The inverse CDFs are stdlib's (@stdlib/stats-base-dists-*).
 */
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';
import triangularQuantile from '@stdlib/stats-base-dists-triangular-quantile';
import uniformQuantile from '@stdlib/stats-base-dists-uniform-quantile';
import type { Distribution } from './types';

/** Φ(z), the standard normal CDF. */
export function phi(z: number): number {
  return normalCdf(z, 0, 1);
}

/** Φ⁻¹(p), the standard normal quantile. */
export function phiInverse(p: number): number {
  return normalQuantile(p, 0, 1);
}

/** The parameters (μ, σ) of ln X for a lognormal X of mean m and SD s. */
export function lognormalParameters(mean: number, sd: number): { mu: number; sigma: number } {
  const s2 = Math.log(1 + (sd / mean) ** 2);
  return { mu: Math.log(mean) - s2 / 2, sigma: Math.sqrt(s2) };
}

/**
 * The value of a distribution at the standard normal score z: the quantile at Φ(z) (for the
 * normal and lognormal directly: μ + σz, exp(μ + σz)).
 *
 * @example valueAtScore({ kind: 'normal', mean: 10, sd: 2 }, 1) // → 12
 */
export function valueAtScore(d: Distribution, z: number): number {
  switch (d.kind) {
    case 'normal':
      return d.mean + d.sd * z;
    case 'lognormal': {
      const { mu, sigma } = lognormalParameters(d.mean, d.sd);
      return Math.exp(mu + sigma * z);
    }
    default:
      return quantile(d, phi(z));
  }
}

/** The quantile of a distribution at probability p (0 < p < 1). */
export function quantile(d: Distribution, p: number): number {
  switch (d.kind) {
    case 'normal':
      return d.mean + d.sd * phiInverse(p);
    case 'lognormal': {
      const { mu, sigma } = lognormalParameters(d.mean, d.sd);
      return Math.exp(mu + sigma * phiInverse(p));
    }
    case 'uniform':
      return uniformQuantile(p, d.min, d.max);
    case 'triangular':
      return triangularQuantile(p, d.min, d.max, d.mode);
    case 'truncated-normal': {
      // the normal's quantile at the same share of the probability between the bounds
      const a = phi((d.min - d.mean) / d.sd);
      const b = phi((d.max - d.mean) / d.sd);
      const x = d.mean + d.sd * phiInverse(a + p * (b - a));
      return Math.min(d.max, Math.max(d.min, x));
    }
  }
}

/**
 * The mean of a distribution (for a truncated normal, the mean after the cut: Johnson, Kotz &
 * Balakrishnan 1994, eq. 13.134).
 */
export function meanOf(d: Distribution): number {
  switch (d.kind) {
    case 'normal':
    case 'lognormal':
      return d.mean;
    case 'uniform':
      return (d.min + d.max) / 2;
    case 'triangular':
      return (d.min + d.mode + d.max) / 3;
    case 'truncated-normal': {
      const { alpha, beta, z } = truncation(d);
      return d.mean + (d.sd * (pdf(alpha) - pdf(beta))) / z;
    }
  }
}

/** The standard deviation of a distribution (truncated normal: JKB 1994, eq. 13.135). */
export function sdOf(d: Distribution): number {
  switch (d.kind) {
    case 'normal':
    case 'lognormal':
      return d.sd;
    case 'uniform':
      return (d.max - d.min) / Math.sqrt(12);
    case 'triangular': {
      const { min: a, mode: c, max: b } = d;
      return Math.sqrt((a * a + b * b + c * c - a * b - a * c - b * c) / 18);
    }
    case 'truncated-normal': {
      const { alpha, beta, z } = truncation(d);
      const r = (pdf(alpha) - pdf(beta)) / z;
      const v = 1 + (alpha * pdf(alpha) - beta * pdf(beta)) / z - r * r;
      return d.sd * Math.sqrt(Math.max(0, v));
    }
  }
}

function pdf(z: number): number {
  return Number.isFinite(z) ? Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI) : 0;
}

function truncation(d: { mean: number; sd: number; min: number; max: number }) {
  const alpha = (d.min - d.mean) / d.sd;
  const beta = (d.max - d.mean) / d.sd;
  return { alpha, beta, z: phi(beta) - phi(alpha) };
}

/** The range a sensitivity plot spans: the 1st to the 99th percentile (the bounds of a bounded distribution). */
export function plotRange(d: Distribution): [number, number] {
  if (d.kind === 'uniform' || d.kind === 'triangular') return [d.min, d.max];
  return [quantile(d, 0.01), quantile(d, 0.99)];
}
