import type { DrawdownSpec, Polyline, Section, Water } from '../model/types';
import { type PreparedSection, prepareSection } from '../slices/prepare-section';

/**
 * A section prepared twice for a rapid drawdown: with the water before it (the section's own)
 * and with the water after it. Each is cut at the other's piezometric line as well as its own
 * (prepareSection's `alsoCutAt`), so that a slip surface is cut into the same slices in both:
 * slice i before drawdown is slice i after it, and the stresses of the first stage carry over
 * to the second base by base.
 */
export interface DrawdownSections {
  before: PreparedSection;
  after: PreparedSection;
}

const lineOf = (w: Water): Polyline[] => (w.kind === 'piezometric' ? [w.line] : []);

/**
 * The two preparations of a section for its drawdown.
 *
 * @example drawdownSections(section, spec).after.section.water // → spec.after
 */
export function drawdownSections(section: Section, spec: DrawdownSpec): DrawdownSections {
  const after: Section = { ...section, water: spec.after };
  return {
    before: prepareSection(section, lineOf(spec.after)),
    after: prepareSection(after, lineOf(section.water)),
  };
}
