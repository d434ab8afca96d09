// The demo corridor (examples/corridor/corridor.json) as the benches run it: each station in
// one case, its own settings, with the design cases of the template and the stations left out.
// The benches' workload stays what it was before the corridor listed cases (one search a
// station); what its cases cost is told in the README ("Design cases: what each gives").
const { readFileSync } = require('node:fs');
const { join } = require('node:path');

/** The corridor batch as parsed JSON, one case a station. */
function oneCaseCorridor() {
  const c = JSON.parse(
    readFileSync(
      join(__dirname, '..', '..', '..', 'examples', 'corridor', 'corridor.json'),
      'utf8',
    ),
  );
  const { cases: _cases, ...template } = c.template ?? {};
  return {
    ...c,
    template,
    sections: c.sections.map(({ cases: _c, ...rest }) => rest),
  };
}

/** The random variables of the demo's corridor with uncertain strength (its template's), without their correlation. */
function uncertainVariables() {
  const file = join(
    __dirname,
    '..',
    '..',
    '..',
    'examples',
    'corridor',
    'wendlecombe-uncertain.json',
  );
  return JSON.parse(readFileSync(file, 'utf8')).template.probability.variables;
}

module.exports = { oneCaseCorridor, uncertainVariables };
