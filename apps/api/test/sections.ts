/**
 * Sections for the worker's tests, from the example corridor (our invented Wendlecombe
 * scenario): a light one, and one whose search asks for a few seconds of work (accepted by the
 * section checks, within WORK_LIMIT), to be stopped by a small time limit.
 */
import fs from 'node:fs';
import path from 'node:path';

const CORRIDOR = path.resolve(__dirname, '../../../examples/corridor/corridor.json');

/** A search of 40 × 40 centres, 20 radii, three moves and a search per method, 500 slices. */
export const HEAVY_ANALYSIS = {
  methods: ['bishop', 'spencer', 'morgenstern-price'],
  slices: 500,
  searchEachMethod: true,
  surface: { type: 'grid', centers: { nx: 40, ny: 40 }, radii: { count: 20 }, moves: 3 },
};

/** The corridor batch with its first `n` sections, `analysis` merged into the template's. */
export function corridorBatch(id: string, n: number, analysis: object = {}) {
  const c = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8'));
  return {
    ...c,
    id,
    template: { ...c.template, analysis: { ...c.template.analysis, ...analysis } },
    sections: c.sections.slice(0, n),
  };
}
