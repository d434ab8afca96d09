/**
 * For specs only: a levee station of the invented Wendlecombe corridor under three design
 * cases, as GET /sections/{id} gives its result (Result.cases, Result.governingCase): long
 * term meets, a rapid drawdown of the river below (three stages, the drawdown report), an
 * earthquake case meets its FS with a yield coefficient and displacement estimates.
 */
import type { CaseView, MethodReport, RunResult } from '../sections/section-types';

function method(fs: number, x0: number, n: number): MethodReport {
  return {
    method: 'spencer',
    fs,
    converged: true,
    iterations: 9,
    lambda: 0.21,
    theta: 11.9,
    surface: { type: 'circle', center: [x0 + 8, 46], radius: 11 },
    slices: Array.from({ length: n }, (_, i) => ({
      x: x0 + i + 0.5,
      width: 1,
      alpha: 30 - 10 * i,
      baseLength: 1.1,
      weight: 40,
      porePressure: 12,
      normal: 30,
      shear: 14,
      interslice: { E: 5, X: 1, thrust: 40 },
      material: i < 2 ? 'core-clay' : 'shell',
    })),
    warnings: [],
  };
}

export const LONG_TERM: CaseView = {
  name: 'long term',
  kind: 'long-term',
  requiredFs: 1.5,
  governs: ['spencer'],
  governing: { method: 'spencer', fs: 1.682 },
  ratio: 1.682 / 1.5,
  verdict: 'meets',
  warnings: [],
  methods: [method(1.682, 10, 3)],
  criticalSurface: { type: 'circle', center: [18, 46], radius: 11 },
  search: null,
};

export const DRAWDOWN: CaseView = {
  name: 'river drawdown',
  kind: 'rapid-drawdown',
  requiredFs: 1.2,
  governs: ['spencer'],
  governing: { method: 'spencer', fs: 1.104 },
  ratio: 1.104 / 1.2,
  verdict: 'below',
  warnings: [],
  methods: [method(1.104, 20, 3)],
  criticalSurface: { type: 'circle', center: [28, 46], radius: 11 },
  search: null,
  drawdown: {
    stages: [
      { stage: 1, fs: 1.913 },
      { stage: 2, fs: 1.187 },
      { stage: 3, fs: 1.104 },
    ],
    drainedFs: 1.062,
    slices: [
      { x: 20.5, material: 'core-clay', strength: 21.4, stage: 'undrained' },
      { x: 21.5, material: 'core-clay', strength: 17.9, stage: 'drained-lower' },
      { x: 22.5, material: 'shell', strength: 30.2, stage: 'drained' },
    ],
  },
};

export const EARTHQUAKE: CaseView = {
  name: 'earthquake',
  kind: 'seismic',
  requiredFs: 1.1,
  governs: ['spencer'],
  governing: { method: 'spencer', fs: 1.163 },
  ratio: 1.163 / 1.1,
  verdict: 'meets',
  warnings: [],
  methods: [method(1.163, 30, 3)],
  criticalSurface: { type: 'circle', center: [38, 46], radius: 11 },
  search: null,
  seismic: {
    ky: 0.183,
    kySurface: { type: 'circle', center: [38, 47], radius: 12 },
    analyses: 7,
    pga: 0.25,
    magnitude: 6.5,
    displacements: [
      { relation: 'jibson-2007', median: 12.4, plusOneSd: 40.1, inRange: true, warnings: [] },
      {
        relation: 'ambraseys-menu-1988',
        median: 16.8,
        plusOneSd: 41.0,
        inRange: false,
        warnings: [{ code: 'out-of-range', message: 'magnitude outside the data of the relation' }],
      },
    ],
    allowable: 150,
    within: true,
  },
};

/** The current result of the station: the drawdown governs (FS / required 0.92). */
export function caseResult(run = 1): RunResult {
  const gov = DRAWDOWN;
  return {
    run,
    verdict: 'below',
    governing: gov.governing,
    requiredFs: gov.requiredFs,
    reason: null,
    criticalSurface: gov.criticalSurface,
    methods: gov.methods,
    warnings: gov.warnings,
    solverVersion: '0.1.0',
    inputHash: 'h',
    timings: {
      startedAt: '2026-12-02T00:00:00.000Z',
      finishedAt: '2026-12-02T00:01:00.000Z',
      durationMs: 40,
    },
    attempt: 1,
    caution: 'c',
    search: null,
    governingCase: gov.name,
    cases: [LONG_TERM, DRAWDOWN, EARTHQUAKE],
  };
}
