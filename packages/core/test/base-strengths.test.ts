/**
 * A strength for each slice base (slices/base-strengths.ts): every method of slices honours it,
 * its pore-pressure switch, and given back its own strengths it changes nothing; the methods
 * that take the strength of the materials refuse it.
 */
import {
  METHODS,
  baseStrengths,
  prepareSection,
  sliceSurface,
  type CircleSurface,
  type MethodId,
} from '@scarpline/core';
import { runOnSurface } from '../src/method-report';
import { makeSection, wetSection } from './helpers/make-section';

const SLICE_METHODS: MethodId[] = ['ordinary', 'bishop', 'janbu', 'spencer', 'morgenstern-price'];
const circle: CircleSurface = { type: 'circle', center: [22, 32], radius: 20 };

describe('a strength for each slice base', () => {
  const section = wetSection();
  const prepared = prepareSection(section);
  const cut = sliceSurface(prepared, circle, 30);
  if (!cut.ok) throw new Error(cut.reason);
  const n = cut.slices.n;

  test("every method of slices honours it: Su on every base, pore pressure not counted, is the undrained soil's F", () => {
    const su = baseStrengths(n);
    su.cohesion.fill(15);
    const undrained = wetSection({
      materials: {
        soil: {
          name: 'soil',
          unitWeight: 18,
          saturatedUnitWeight: 18,
          strength: { model: 'undrained', su: 15, suRate: 0, suDatum: null },
        },
      },
    });
    const p2 = prepareSection(undrained);
    const cut2 = sliceSurface(p2, circle, 30);
    for (const m of SLICE_METHODS) {
      const a = runOnSurface(m, prepared, circle, cut, su);
      const b = runOnSurface(m, p2, circle, cut2);
      expect(a.converged).toBe(true);
      expect(Math.abs(a.fs! - b.fs!)).toBeLessThan(1e-12 * b.fs!);
      // on a total-stress base the report gives u = 0 and the total normal force
      expect(a.slices.every((s) => s.porePressure === 0)).toBe(true);
    }
  });

  test('every method honours the pore pressure switch: c′, φ′ with u not counted is the dry section', () => {
    const drained = baseStrengths(n);
    drained.cohesion.fill(10);
    drained.tanPhi.fill(Math.tan((25 * Math.PI) / 180));
    // the dry section cut at the wet section's line too, so that both have the same slices
    const dry = makeSection();
    const p2 = prepareSection(
      dry,
      section.water.kind === 'piezometric' ? [section.water.line] : [],
    );
    const cut2 = sliceSurface(p2, circle, 30);
    for (const m of SLICE_METHODS) {
      const a = runOnSurface(m, prepared, circle, cut, drained);
      const b = runOnSurface(m, p2, circle, cut2);
      const plain = runOnSurface(m, prepared, circle, cut);
      expect(Math.abs(a.fs! - b.fs!)).toBeLessThan(1e-12 * b.fs!);
      // and the water lowers F when it counts
      expect(plain.fs!).toBeLessThan(0.98 * b.fs!);
    }
  });

  test("a base's own strength given back changes nothing", () => {
    const own = baseStrengths(n);
    own.cohesion.set(cut.slices.cohesion);
    own.tanPhi.set(cut.slices.tanPhi);
    own.porePressureCounts.fill(1);
    for (const m of SLICE_METHODS) {
      expect(runOnSurface(m, prepared, circle, cut, own)).toEqual(
        runOnSurface(m, prepared, circle, cut),
      );
    }
  });

  test('the φ = 0 circle and the log spiral, which take the strength of the materials, refuse it', () => {
    for (const m of ['phi-zero-circle', 'log-spiral'] as const) {
      const r = runOnSurface(m, prepared, circle, cut, baseStrengths(n));
      expect(r.converged).toBe(false);
      expect(r.warnings[0].code).toBe('not-applicable');
      expect(METHODS[m].slices).toBe(false);
    }
  });
});
