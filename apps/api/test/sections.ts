/**
 * Sections for the worker's tests, from the example corridor (our invented Wendlecombe
 * scenario): light ones (a fraction of a second), and a heavy one to be stopped by a small time
 * limit. The heavy one is read with a search the section checks accept (HEAVY_ANALYSIS, a few
 * seconds here) and then given a grid of HEAVY_CENTRES² centres (about ten seconds here, within
 * the work meter's bound): the checks now refuse settings that ask for that much work, and the
 * time limit is the second line of defence (a slower machine, an estimate that is off), which
 * needs a section that clearly outlasts it whatever the machine's speed.
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

/** Centres a side of the heavy section's grid once it has been read (see above). */
export const HEAVY_CENTRES = 100;

/**
 * The demo corridor one case a station, for the tests that time and limit the worker: its
 * long-term case (the template's own settings, named in analysis.case as the corridor named it
 * before it listed design cases). Its earthquake case (the yield coefficient's searches) and
 * end-of-construction case would make every section several times the work these tests are
 * tuned to, and the heavy section more than the checks of a file accept.
 */
export function oneCaseCorridor() {
  const c = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8'));
  delete c.template.cases;
  c.template.analysis = { ...c.template.analysis, case: 'long-term' };
  for (const s of c.sections) delete s.cases;
  return c;
}

/** The corridor batch (oneCaseCorridor) with its first `n` sections, `analysis` merged into the template's. */
export function corridorBatch(id: string, n: number, analysis: object = {}) {
  const c = oneCaseCorridor();
  return {
    ...c,
    id,
    template: { ...c.template, analysis: { ...c.template.analysis, ...analysis } },
    sections: c.sections.slice(0, n),
  };
}
