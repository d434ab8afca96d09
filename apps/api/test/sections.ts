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
const UNCERTAIN = path.resolve(__dirname, '../../../examples/corridor/wendlecombe-uncertain.json');

/** A search of 40 × 40 centres, 20 radii, three moves and a search per method, 500 slices. */
export const HEAVY_ANALYSIS = {
  methods: ['bishop', 'spencer', 'morgenstern-price'],
  slices: 500,
  searchEachMethod: true,
  surface: { type: 'grid', centers: { nx: 40, ny: 40 }, radii: { count: 20 }, moves: 3 },
};

/** Centres a side of the heavy section's grid once it has been read (see above). */
export const HEAVY_CENTRES = 100;

/** The corridor batch with its first `n` sections, `analysis` merged into the template's. */
export function corridorBatch(
  id: string,
  n: number,
  analysis: object = {},
  { oneCase = false }: { oneCase?: boolean } = {},
) {
  const c = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8'));
  const template = { ...c.template, analysis: { ...c.template.analysis, ...analysis } };
  let sections = c.sections.slice(0, n);
  if (oneCase) {
    // each station's own settings as its one case: the design cases left out
    delete template.cases;
    sections = sections.map(({ cases: _cases, ...rest }: { cases?: unknown }) => rest);
  }
  return { ...c, id, template, sections };
}

/**
 * The random variables of the demo's corridor with uncertain strength (its template's: c′ and
 * φ′ of the weathered mudstone), without their correlation.
 */
export function uncertainVariables() {
  const c = JSON.parse(fs.readFileSync(UNCERTAIN, 'utf8'));
  return c.template.probability.variables as {
    name: string;
    target: string;
    distribution: 'lognormal' | 'normal';
    mean: number;
    cov?: number;
    sd?: number;
  }[];
}
