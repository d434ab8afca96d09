import type { CircleOrigin, GridReport, HowFound, SearchReport } from '../result';
import type { SearchOutcome } from './search-section';
import type { CircleTrial } from './trials';

/** The search's account of the critical circle: candidates, polishes, confirmation. */
function howFound(found: SearchOutcome): HowFound | null {
  const c = found.circle;
  if (!c || !found.confirmation) return null;
  const name = (b: number) => (b >= 0 ? found.boundaries[b].material : null);
  const origin = (t: { stage: CircleOrigin['stage']; boundary: number }): CircleOrigin => ({
    stage: t.stage,
    touching: name(t.boundary),
  });
  // the critical circle's origin: back along the polishes that led to it, to the first start
  let critical = origin(c);
  let at = found.polishes.find((p) => p.to === c);
  while (at) {
    const boundary = at.boundary >= 0 ? at.boundary : at.from.boundary;
    critical = { stage: 'polish', touching: name(boundary) ?? critical.touching };
    const from = at.from;
    at = from.stage === 'polish' ? found.polishes.find((p) => p.to === from) : undefined;
  }
  return {
    candidates: {
      grid: found.candidates.grid,
      groundRanges: found.candidates['ground-ranges'],
      polish: found.candidates.polish,
    },
    boundaries: found.boundaries.map((b) => b.material),
    polishes: found.polishes.map((p) => ({
      from: p.from.fs,
      to: p.to.fs,
      start: origin(p.from),
      evaluations: p.evaluations,
      touching: name(p.boundary),
    })),
    critical,
    confirmation: { method: 'bishop', ...found.confirmation },
  };
}

/** The most trial surfaces a report keeps (the lowest of the distinct ones within the band). */
export const TRIAL_SURFACES_KEPT = 100;

/**
 * The circles (lowest first) without those that a drawing could not tell apart from a lower
 * one kept before them: centre and radius each within 1 % of its radius.
 */
function distinctCircles(circles: readonly CircleTrial[], most: number): CircleTrial[] {
  const kept: CircleTrial[] = [];
  for (const c of circles) {
    if (kept.length >= most) break;
    const tol = 0.01 * c.radius;
    const same = kept.some(
      (k) =>
        Math.abs(k.radius - c.radius) <= tol &&
        Math.hypot(k.center[0] - c.center[0], k.center[1] - c.center[1]) <= tol,
    );
    if (!same) kept.push(c);
  }
  return kept;
}

/**
 * What a search did, for the result (SI; analyzeSection converts it to the file's units with
 * the rest): the grid and its moves, the FS map, the trial circles within the band of the least
 * FS and how the critical
 * circle was found and confirmed.
 */
export function searchReport(found: SearchOutcome): SearchReport {
  const grid = (g: GridReport): GridReport => ({ x: [...g.x], y: [...g.y], nx: g.nx, ny: g.ny });
  const gr = found.grid;
  return {
    type: found.settings.type,
    method: 'bishop',
    ...(found.polyline ? { noncircularMethod: 'spencer' as const } : {}),
    trials: found.trials,
    moves: gr ? gr.moves.map((m) => ({ reason: m.reason, grid: grid(m.grid) })) : [],
    grid: gr ? grid(gr.grid) : null,
    map: gr
      ? {
          xs: [...gr.xs],
          ys: [...gr.ys],
          fs: gr.fs.map((row) => row.map((v) => (Number.isFinite(v) ? v : null))),
        }
      : null,
    trialBand: {
      within: found.band,
      count: found.withinBand.length,
      surfaces: distinctCircles(found.withinBand, TRIAL_SURFACES_KEPT).map((t) => ({
        surface: { type: 'circle', center: [t.center[0], t.center[1]], radius: t.radius },
        fs: t.fs,
      })),
    },
    howFound: howFound(found),
  };
}
