/**
 * The sampling loop's numbers: the standard normal scores of realisation i of a seeded run,
 * by Monte Carlo or Latin hypercube (McKay, Beckman & Conover 1979), correlated through the
 * Cholesky factor of the correlation matrix. Realisation i depends only on the seed, N and
 * i, so realisations i..j computed anywhere (a chunk on another worker) are those of one run.
 */
import { seededRandom } from '../numeric/seeded-random';
import { phiInverse } from './distributions';
export { cholesky } from './cholesky';
import type { SamplingMethod } from './types';

/** A 32-bit hash of a seed and two integers (the finaliser of MurmurHash3), for independent streams. */
export function streamSeed(seed: number, i: number, stream: number): number {
  let h = (seed ^ Math.imul(i + 1, 0x9e3779b1) ^ Math.imul(stream + 1, 0x632be5ab)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/** A uniform number strictly inside (0, 1) from a generator of [0, 1). */
function open01(next: () => number): number {
  return (Math.floor(next() * 4294967296) + 0.5) / 4294967296;
}

/** The scores of realisations of one seeded run: `scores(i)` gives the n correlated standard normal scores of realisation i. */
export interface Sampler {
  scores(i: number): Float64Array;
}

/**
 * A sampler of n variables for a run of N realisations. Latin hypercube: each variable's N
 * strata of probability taken once each, in a seeded random order, at a seeded random point
 * inside the stratum; the correlation is then put on the normal scores by L (common practice;
 * it keeps each marginal's strata only approximately when variables are correlated).
 *
 * @example sampler(2, 1000, 7, 'latin-hypercube', null).scores(0) // → Float64Array [z1, z2]
 */
export function sampler(
  n: number,
  realisations: number,
  seed: number,
  method: SamplingMethod,
  factor: number[][] | null,
): Sampler {
  const perms: Uint32Array[] = [];
  if (method === 'latin-hypercube') {
    for (let k = 0; k < n; k++) {
      const p = new Uint32Array(realisations);
      for (let i = 0; i < realisations; i++) p[i] = i;
      const next = seededRandom(streamSeed(seed, k, 1));
      for (let i = realisations - 1; i > 0; i--) {
        const j = Math.floor(next() * (i + 1));
        const t = p[i];
        p[i] = p[j];
        p[j] = t;
      }
      perms.push(p);
    }
  }
  const z = new Float64Array(n);
  return {
    scores(i: number): Float64Array {
      const next = seededRandom(streamSeed(seed, i, 0));
      for (let k = 0; k < n; k++) {
        const u =
          method === 'latin-hypercube' ? (perms[k][i] + open01(next)) / realisations : open01(next);
        z[k] = phiInverse(u);
      }
      if (!factor) return Float64Array.from(z);
      const out = new Float64Array(n);
      for (let a = 0; a < n; a++) {
        let s = 0;
        for (let b = 0; b <= a; b++) s += factor[a][b] * z[b];
        out[a] = s;
      }
      return out;
    },
  };
}
