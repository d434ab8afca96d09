/**
 * For specs only: studies of a flood bank of the invented Wendlecombe corridor (the stored
 * section of rerun-case-fixtures with two random variables on its core), as the API gives
 * them. The numbers are invented for the display, not computed.
 */
import type { CaseProbability } from '@scarpline/core/result';
import type { SectionInput } from '../sections/section-types';
import type { Study } from '../studies/study-types';
import { sectionWithCases } from './rerun-case-fixtures';

/** The flood bank with random c′ and φ′ of its core (SI), Monte Carlo, 2 000 realisations. */
export function sectionWithVariables(): SectionInput {
  return {
    ...sectionWithCases(),
    probability: {
      variables: [
        {
          name: 'core c′',
          target: 'materials.core.cohesion',
          distribution: { kind: 'lognormal', mean: 5, sd: 1.5 },
        },
        {
          name: 'core φ′',
          target: 'materials.core.frictionAngle',
          distribution: { kind: 'normal', mean: 27, sd: 2 },
        },
      ],
      correlations: [],
      seed: 7,
      method: 'monte-carlo',
      realisations: 2000,
      surface: 'critical',
    },
  };
}

function caseProbability(name: string, requiredFs: number, meanFs: number): CaseProbability {
  return {
    case: name,
    requiredFs,
    method: 'spencer',
    deterministicFs: meanFs + 0.01,
    surface: 'critical',
    realisations: 2000,
    valid: 1998,
    meanFs,
    sdFs: 0.161,
    minFs: 0.92,
    maxFs: 2.2,
    pFailure: { p: 0.0125, standardError: 0.00248 },
    pBelowRequired: { p: 0.184, standardError: 0.00866 },
    betaNormal: { beta: 2.91, pf: 0.0018 },
    betaLognormal: { beta: 3.36, pf: 0.0004 },
    histogram: [
      { from: 0.9, to: 1, count: 25 },
      { from: 1, to: 1.5, count: 900 },
      { from: 1.5, to: 2.2, count: 1073 },
    ],
    cdf: [
      [0.92, 0],
      [1, 0.0125],
      [1.5, 0.47],
      [2.2, 1],
    ],
    convergence: [{ n: 2000, p: 0.0125, standardError: 0.00248 }],
  };
}

/** A study of section 9, run 3, asked by Evan Engineer (user 2): queued unless said otherwise. */
export function aStudy(fields: Partial<Study> = {}): Study {
  return {
    id: 41,
    sectionId: 9,
    batchId: 5,
    run: 3,
    kind: 'probability',
    status: 'queued',
    request: { kind: 'probability' },
    progress: { done: 0, total: 2000 },
    result: null,
    problem: null,
    requestedBy: { id: 2, name: 'Evan Engineer' },
    createdAt: '2026-12-02T09:40:00Z',
    finishedAt: null,
    caution: 'Results need review.',
    ...fields,
  };
}

/** A done probabilistic analysis of two cases with its Taylor series check. */
export function doneProbability(): Study {
  return aStudy({
    status: 'done',
    progress: { done: 2000, total: 2000 },
    finishedAt: '2026-12-02T09:41:00Z',
    result: {
      kind: 'probability',
      probability: {
        id: 'wc-0520',
        title: 'Wendle flood bank 0+520',
        station: 520,
        method: 'monte-carlo',
        seed: 7,
        variables: sectionWithVariables().probability!.variables,
        correlations: [],
        cases: [
          caseProbability('long term', 1.5, 1.468),
          caseProbability('design flood', 1.3, 1.35),
        ],
        caution: 'c',
      },
      taylor: {
        id: 'wc-0520',
        title: 'Wendle flood bank 0+520',
        cases: [
          {
            case: 'long term',
            fsMean: 1.478,
            terms: [],
            correlationShare: null,
            sdFs: 0.155,
            betaNormal: { beta: 3.08, pf: 0.001 },
            betaLognormal: { beta: 3.5, pf: 0.0002 },
            analyses: 5,
          },
        ],
        caution: 'c',
      },
    },
  });
}
