import { fromSi } from './model/units';
import type {
  CircleSurface,
  MethodId,
  Point,
  PolylineSurface,
  SearchSurface,
  Section,
  UnitSystem,
} from './model/types';
import { bishop } from './methods/bishop';
import { infiniteSlope } from './methods/infinite-slope';
import { janbu } from './methods/janbu';
import { logSpiral } from './methods/log-spiral';
import { morgensternPrice } from './methods/morgenstern-price';
import { ordinary } from './methods/ordinary';
import { defaultPivot } from './methods/pivot';
import { spencer } from './methods/spencer';
import { swedishCircle } from './methods/swedish-circle';
import type { MethodWarning, SliceMethodResult } from './methods/types';
import { type PreparedSection, prepareSection } from './slices/prepare-section';
import { type SliceOutcome, type SliceSet, sliceSurface } from './slices/slice-surface';
import { refineCircle } from './search/refine-circle';
import { type SearchOutcome, searchSection } from './search/search-section';
import { Trials } from './search/trials';
import { CAUTION } from './caution';
import { verdictOf } from './verdict';
import type {
  CircleOrigin,
  GridReport,
  HowFound,
  MethodReport,
  ReportedSurface,
  SearchReport,
  SectionResult,
  SliceReport,
  Warning,
} from './result';

export { CAUTION };

/** The version of the solver, stored with every result. */
export const SOLVER_VERSION = '0.1.0';

function howFound(found: SearchOutcome): HowFound | null {
  const c = found.circle;
  if (!c || !found.confirmation) return null;
  const name = (b: number) => (b >= 0 ? found.boundaries[b].material : null);
  const origin = (t: { stage: CircleOrigin['stage']; boundary: number }): CircleOrigin => ({
    stage: t.stage,
    touching: name(t.boundary),
  });
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
    critical: origin(c),
    confirmation: { method: 'bishop', ...found.confirmation },
  };
}

function searchReport(found: SearchOutcome, units: UnitSystem): SearchReport {
  const L = (v: number) => fromSi(v, 'length', units);
  const grid = (g: {
    x: [number, number];
    y: [number, number];
    nx: number;
    ny: number;
  }): GridReport => ({
    x: [L(g.x[0]), L(g.x[1])],
    y: [L(g.y[0]), L(g.y[1])],
    nx: g.nx,
    ny: g.ny,
  });
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
          xs: gr.xs.map(L),
          ys: gr.ys.map(L),
          fs: gr.fs.map((row) => row.map((v) => (Number.isFinite(v) ? v : null))),
        }
      : null,
    lowest: found.lowest.map((t) => ({
      surface: { type: 'circle', center: [L(t.center[0]), L(t.center[1])], radius: L(t.radius) },
      fs: t.fs,
    })),
    howFound: howFound(found),
  };
}

/** The critical circle of one method: the search's best circle polished with that method on the exact slicing. */
function ownCircle(
  method: MethodId,
  prepared: PreparedSection,
  start: CircleSurface,
): CircleSurface {
  const evaluate = (xc: number, yc: number, r: number) => {
    const c: CircleSurface = { type: 'circle', center: [xc, yc], radius: r };
    const rep = runOnSurface(
      method,
      prepared,
      c,
      sliceSurface(prepared, c, prepared.section.analysis.slices),
    );
    return rep.converged && rep.fs !== null ? rep.fs : NaN;
  };
  const f0 = evaluate(start.center[0], start.center[1], start.radius);
  if (!(f0 > 0)) return start;
  const best = refineCircle(
    { center: start.center, radius: start.radius, fs: f0, stage: 'polish', boundary: -1 },
    start.radius / 20,
    evaluate,
    new Trials(1),
  ).to;
  return { type: 'circle', center: best.center, radius: best.radius };
}

const SLICE_METHODS: readonly MethodId[] = [
  'ordinary',
  'bishop',
  'janbu',
  'spencer',
  'morgenstern-price',
];
const CIRCLE_ONLY: readonly MethodId[] = ['ordinary', 'bishop', 'swedish-circle', 'log-spiral'];
const deg = (r: number) => (r * 180) / Math.PI;

/** A number safe for JSON: never NaN or infinite. */
const finite = (v: number) => (Number.isFinite(v) ? v : 0);

function reportSlices(
  prepared: PreparedSection,
  s: SliceSet,
  r: SliceMethodResult | null,
  units: UnitSystem,
): SliceReport[] {
  const L = (v: number) => fromSi(v, 'length', units);
  const P = (v: number) => fromSi(v, 'forcePerLength', units);
  const out: SliceReport[] = [];
  for (let i = 0; i < s.n; i++) {
    const b = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    // the right side in section coordinates: the left side in sliding orientation when mirrored
    const j = s.mirrored ? i - 1 : i;
    const E = r && j >= 0 ? r.E[j] : 0;
    const X = r && j >= 0 ? r.X[j] : 0;
    const thrust = r && j >= 0 && Number.isFinite(r.thrust[j]) ? L(r.thrust[j]) : null;
    out.push({
      x: L((s.mirrored ? -1 : 1) * 0.5 * (s.xl[i] + s.xr[i])),
      width: L(b),
      alpha: (s.mirrored ? -1 : 1) * deg(Math.atan2(dy, b)),
      baseLength: L(Math.hypot(b, dy)),
      weight: P(s.weight[i]),
      porePressure: fromSi(s.porePressure[i], 'pressure', units),
      normal: P(r ? finite(r.normal[i]) : 0),
      shear: P(r ? finite(r.shear[i]) : 0),
      interslice: { E: P(finite(E)), X: P(finite(X)), thrust },
      material: prepared.materials[s.material[i]].name,
    });
  }
  if (s.mirrored) out.reverse();
  return out;
}

function surfaceReport(
  surface: CircleSurface | PolylineSurface,
  units: UnitSystem,
): ReportedSurface {
  const L = (v: number) => fromSi(v, 'length', units);
  const pt = (p: Point): Point => [L(p[0]), L(p[1])];
  return surface.type === 'circle'
    ? { type: 'circle', center: pt(surface.center), radius: L(surface.radius) }
    : { type: 'polyline', points: surface.points.map(pt) };
}

/** With c′ = 0 along a circle: the infinite-slope F of the steepest ground within the mass (dry or with ru). */
function cohesionlessWarning(prepared: PreparedSection, s: SliceSet): Warning | null {
  let allFrictional = true;
  for (let i = 0; i < s.n; i++) if (s.cohesion[i] > 0 || !(s.tanPhi[i] > 0)) allFrictional = false;
  if (!allFrictional) return null;
  let beta = 0;
  let tanPhi = Infinity;
  for (let i = 0; i < s.n; i++) {
    const b = Math.atan(Math.abs(s.yTopR[i] - s.yTopL[i]) / (s.xr[i] - s.xl[i]));
    if (b > beta) beta = b;
    tanPhi = Math.min(tanPhi, s.tanPhi[i]);
  }
  if (!(beta > 0)) return null;
  const water = prepared.section.water;
  const ru = water.kind === 'ru' ? water.ru : 0;
  const fInf = ((1 - ru / Math.cos(beta) ** 2) * tanPhi) / Math.tan(beta);
  return {
    code: 'cohesionless-circle',
    message: `c′ = 0 along this surface: the critical circle tends to a shallow slide parallel to the steepest ground (β = ${deg(beta).toFixed(1)}°), whose infinite-slope factor of safety is ${fInf.toFixed(3)}${ru > 0 ? ` with ru = ${ru}` : ' (no pore pressure)'}; that value governs`,
  };
}

function notRun(
  method: MethodId,
  reason: string,
  surface: ReportedSurface | null = null,
): MethodReport {
  return {
    method,
    fs: null,
    converged: false,
    iterations: 0,
    reason,
    surface,
    slices: [],
    warnings: [{ code: 'not-applicable', message: reason }],
  };
}

function runInfiniteSlope(section: Section): MethodReport {
  const spec = section.analysis.infiniteSlope;
  if (!spec)
    return notRun(
      'infinite-slope',
      'infinite slope: give analysis.infiniteSlope (angle, depth, waterRatio)',
    );
  const material = section.materials[section.strata[0].material];
  const r = infiniteSlope({
    ...spec,
    material,
    waterUnitWeight: section.water.unitWeight,
    kh: section.seismic.kh,
  });
  const surface: ReportedSurface = {
    type: 'plane',
    angle: spec.angle,
    depth: fromSi(spec.depth, 'length', section.units),
  };
  return {
    method: 'infinite-slope',
    fs: r.converged ? r.fs : null,
    converged: r.converged,
    iterations: 0,
    ...(r.reason ? { reason: r.reason } : {}),
    surface,
    slices: [],
    warnings: r.reason ? [{ code: 'no-convergence', message: r.reason }] : [],
  };
}

function runOnSurface(
  method: MethodId,
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  cut: SliceOutcome,
): MethodReport {
  const section = prepared.section;
  const units = section.units;
  const reported = surfaceReport(surface, units);
  if (CIRCLE_ONLY.includes(method) && surface.type !== 'circle') {
    return notRun(
      method,
      `${method}: applies to circular surfaces; use janbu, spencer or morgenstern-price on a polyline`,
      reported,
    );
  }
  if (!cut.ok) return notRun(method, `the slip surface was rejected: ${cut.reason}`, reported);
  const s = cut.slices;
  const seismic = section.seismic;
  const pivot: Point =
    surface.type === 'circle'
      ? [(s.mirrored ? -1 : 1) * surface.center[0], surface.center[1]]
      : defaultPivot(s);
  let r: SliceMethodResult;
  let slicesForReport = s;
  const extra: Partial<MethodReport> = {};
  switch (method) {
    case 'ordinary':
      r = ordinary(s, { seismic, pivot });
      break;
    case 'bishop':
      r = bishop(s, { seismic, pivot });
      break;
    case 'janbu':
      r = janbu(s, { seismic });
      if (r.converged)
        Object.assign(extra, { fsUncorrected: r.fsUncorrected, correction: r.correction });
      break;
    case 'spencer':
      r = spencer(s, { seismic, pivot });
      if (r.converged && r.lambda !== undefined)
        Object.assign(extra, { lambda: r.lambda, theta: deg(Math.atan(r.lambda)) });
      break;
    case 'morgenstern-price': {
      const fn = section.analysis.interslice ?? { shape: 'half-sine' as const };
      r = morgensternPrice(s, { seismic, pivot, fn });
      extra.intersliceFunction = fn.shape;
      if (r.converged && r.lambda !== undefined) extra.lambda = r.lambda;
      break;
    }
    case 'swedish-circle': {
      const c = surface as CircleSurface;
      const sw = swedishCircle(prepared, cut, c.center, c.radius, seismic);
      r = sw;
      if (sw.converged) {
        extra.massWeight = fromSi(sw.massWeight, 'forcePerLength', units);
        extra.leverArm = fromSi(sw.leverArm, 'length', units);
      }
      break;
    }
    case 'log-spiral': {
      const c = surface as CircleSurface;
      const ls = logSpiral(prepared, s, c.center, seismic, section.analysis.slices);
      r = ls;
      if (ls.converged && ls.spiral && ls.spiralSlices) {
        const L = (v: number) => fromSi(v, 'length', units);
        extra.surface = {
          type: 'log-spiral',
          pole: [L(ls.spiral.pole[0]), L(ls.spiral.pole[1])],
          r0: L(ls.spiral.r0),
          r1: L(ls.spiral.r1),
          points: ls.spiral.points.map((p) => [L(p[0]), L(p[1])] as Point),
        };
        slicesForReport = ls.spiralSlices;
      }
      break;
    }
    default:
      return notRun(method, `${method}: not a method of slices`);
  }
  const L = (v: number) => fromSi(v, 'length', units);
  const pt = (p: Point): Point => [L(p[0]), L(p[1])];
  const warnings: Warning[] = [...r.warnings];
  if (surface.type === 'circle' && SLICE_METHODS.includes(method)) {
    const w = cohesionlessWarning(prepared, s);
    if (w) warnings.push(w);
  }
  return {
    method,
    fs: r.converged ? r.fs : null,
    converged: r.converged,
    iterations: r.iterations,
    ...(r.reason ? { reason: r.reason } : {}),
    surface: reported,
    base: cut.base.map(pt),
    ends: { upper: pt(cut.upperEnd), lower: pt(cut.lowerEnd) },
    crack: cut.crack
      ? {
          x: L(cut.crack.x),
          depth: L(cut.crack.depth),
          waterDepth: L(cut.crack.waterDepth),
          waterForce: fromSi(cut.crack.waterForce, 'forcePerLength', units),
        }
      : null,
    slices: reportSlices(prepared, slicesForReport, r.converged ? r : null, units),
    warnings,
    ...extra,
  };
}

/**
 * Analyse one validated, normalised section: each requested method on the given slip
 * surface (a circle or a polyline) or, for the infinite slope, on analysis.infiniteSlope.
 * The result is plain JSON in the section's own units, with the governing (lowest converged)
 * factor of safety, its verdict against the required FS, the warnings and the caution.
 *
 * @example analyzeSection(parseSections(text, 'cut.yaml').sections[0]).governing
 */
export function analyzeSection(section: Section): SectionResult {
  const prepared = prepareSection(section);
  const analysis = section.analysis;
  const surface = analysis.surface;
  const warnings: Warning[] = [];
  const cuts = new Map<CircleSurface | PolylineSurface, SliceOutcome>();
  const cutOf = (sf: CircleSurface | PolylineSurface) => {
    let c = cuts.get(sf);
    if (!c) {
      c = sliceSurface(prepared, sf, analysis.slices);
      cuts.set(sf, c);
    }
    return c;
  };
  let circle: CircleSurface | null = null;
  let polyline: PolylineSurface | null = null;
  let found: SearchOutcome | null = null;
  if (surface && surface.type === 'circle') circle = surface as CircleSurface;
  else if (surface && surface.type === 'polyline') polyline = surface as PolylineSurface;
  else if (surface) {
    found = searchSection(prepared, surface as SearchSurface);
    if (found.circle)
      circle = { type: 'circle', center: found.circle.center, radius: found.circle.radius };
    if (found.polyline) polyline = { type: 'polyline', points: found.polyline.points };
    if (!found.circle) {
      warnings.push({
        code: 'no-surface',
        message:
          'the search found no admissible slip surface: check the grid, the radii and the ground ranges',
      });
    }
    if (found.onEdge) {
      warnings.push({
        code: 'minimum-on-edge',
        message: `the lowest factor of safety is still on the edge of the search grid after ${found.grid?.moves.length ?? 0} moves: the true minimum may lie outside it; widen the grid`,
      });
    }
  }
  for (const sf of [circle, polyline]) {
    if (sf && !found) {
      const c = cutOf(sf);
      if (!c.ok)
        warnings.push({
          code: 'surface-rejected',
          message: `the slip surface was rejected: ${c.reason}`,
        });
    }
  }
  const results: MethodReport[] = analysis.methods.map((method) => {
    if (method === 'infinite-slope') return runInfiniteSlope(section);
    if (!surface)
      return notRun(method, `${method}: the section gives no slip surface (analysis.surface)`);
    let own = circle;
    if (own && found && analysis.searchEachMethod) own = ownCircle(method, prepared, own);
    const onCircle = own ? runOnSurface(method, prepared, own, cutOf(own)) : null;
    if (CIRCLE_ONLY.includes(method) || !polyline) {
      return onCircle ?? notRun(method, `${method}: no admissible slip surface was found`);
    }
    const onPolyline = runOnSurface(method, prepared, polyline, cutOf(polyline));
    // the critical surface of this method: the lower of the best circle and the noncircular surface
    if (!onCircle || !onCircle.converged) return onPolyline;
    return onPolyline.converged && onPolyline.fs! < onCircle.fs! ? onPolyline : onCircle;
  });
  if (found?.cohesionless && !analysis.methods.includes('infinite-slope')) {
    const cl = found.cohesionless;
    const message = `no soil on this slope has cohesion (c′ = 0): circles drift toward an infinite radius, so the infinite slope on the steepest ground (β = ${cl.angle.toFixed(1)}°) governs with F = ${cl.fs.toFixed(3)}`;
    warnings.push({ code: 'cohesionless-circle', message });
    results.push({
      method: 'infinite-slope',
      fs: cl.fs,
      converged: true,
      iterations: 0,
      surface: { type: 'plane', angle: cl.angle, depth: 0 },
      slices: [],
      warnings: [{ code: 'cohesionless-circle', message }],
    });
  }
  let governing: SectionResult['governing'] = null;
  for (const r of results) {
    if (r.converged && r.fs !== null && (governing === null || r.fs < governing.fs)) {
      governing = { method: r.method, fs: r.fs };
    }
  }
  // without cohesion the infinite slope is the limit the circles tend to: it governs
  if (found?.cohesionless) governing = { method: 'infinite-slope', fs: found.cohesionless.fs };
  for (const r of results) {
    const applies = !r.warnings.some((w) => w.code === 'not-applicable');
    if (!r.converged && applies) {
      warnings.push({
        code: 'no-convergence',
        message: `${r.method}: ${r.reason ?? 'no solution'}`,
      });
    }
  }
  const required = analysis.requiredFs;
  return {
    id: section.id,
    title: section.title,
    station: section.station,
    units: section.units,
    case: analysis.case,
    requiredFs: required,
    results,
    governing,
    verdict: verdictOf(governing?.fs ?? null, required),
    warnings,
    search: found ? searchReport(found, section.units) : null,
    solverVersion: SOLVER_VERSION,
    caution: CAUTION,
  };
}

/** Warnings of a method result, for callers that only need the codes. */
export type { MethodWarning };
