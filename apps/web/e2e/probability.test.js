/**
 * A corridor with uncertain strength, as an engineer reads it: the batch page draws each
 * station's probability of failure along the chainage, the section page shows the run's own
 * P(FS < 1) and makes a probabilistic study whose numbers are the service's.
 */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const fs = require('node:fs');
const path = require('node:path');
const { api, eventually, launch, scenario, shot, signIn, submitToDemo } = require('./support');

const CORRIDOR = path.resolve(__dirname, '../../../examples/corridor/wendlecombe-uncertain.json');
const STATIONS = 6;

/**
 * Six stations of the demo's corridor with uncertain strength (examples/corridor/
 * wendlecombe-uncertain.json: the weathered mudstone's c′ and φ′ random and correlated), from
 * 1+220, where the cutting is deepest and some realisations fail.
 */
function corridorWithVariables() {
  const c = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8'));
  c.id = 'wcb-uncertain-six';
  c.sections = c.sections.filter((s) => s.station >= 1220).slice(0, STATIONS);
  return JSON.stringify(c, null, 2);
}

/** 0.0125 → "0.0125" as the page writes a probability (three significant figures, 0 as 0). */
const probabilityText = (p) => (p === 0 ? '0' : p.toPrecision(3));

let browser;
before(async () => {
  browser = await launch();
});
after(() => browser?.close());

test(
  'engineer: P(FS < 1) along the chainage, and a probabilistic study of one section',
  { timeout: 240_000 },
  async () => {
    await scenario(browser, 'probability', async ({ page }) => {
      await signIn(page, 'engineer');
      const { token, batchId } = await submitToDemo(page, corridorWithVariables(), 150_000);

      // Each station's P(FS < 1) from the service, and a point of the chart for each.
      const rows = await api(token, `/batches/${batchId}/sections?pageSize=500`);
      assert.equal(rows.status, 200);
      const withP = rows.body.items.filter((s) => Array.isArray(s.probability));
      assert.equal(withP.length, STATIONS, 'every station carries its probability of failure');
      const chart = page.getByTestId('pf-chart');
      await chart.waitFor();
      const points = chart.getByTestId('pf-point');
      await eventually(async () => (await points.count()) === STATIONS, {
        what: `${STATIONS} points of P(FS < 1) along the chainage`,
      });
      const first = withP[0];
      const point = chart.locator(`[data-testid="pf-point"][data-station="${first.station}"]`);
      const label = await point.getAttribute('aria-label');
      assert.ok(
        label.includes(probabilityText(first.probability[0].pFailure.p)),
        `the point of ${first.station} says its P_f (${label})`,
      );
      await shot(page, 'batch-probability');

      // The section: the run's own P(FS < 1), then a study with the section's variables.
      await page.goto(`/sections/${first.id}`);
      const card = page.getByTestId('section-studies');
      await card.waitFor();
      await card.getByTestId('run-probability-row').first().waitFor();
      assert.equal(await card.getByTestId('study-variable').count(), 2);
      await card.getByTestId('ask-study').click();
      const row = card.getByTestId('study-row').first();
      await row.waitFor();
      await eventually(
        async () => /done/i.test(await row.getByTestId('study-status').innerText()),
        {
          timeout: 90_000,
          interval: 1000,
          what: 'the probabilistic study to be done',
        },
      );
      const studies = await api(token, `/sections/${first.id}/studies`);
      const study = (Array.isArray(studies.body) ? studies.body : studies.body.items)[0];
      assert.equal(study.status, 'done');
      const expected = study.result.probability.cases[0].pFailure;
      const result = card.getByTestId('study-result');
      await result.waitFor();
      await eventually(
        async () =>
          (await result.getByTestId('p-failure').first().innerText()).includes(
            probabilityText(expected.p),
          ),
        { what: `P(FS < 1) ${expected.p} on the page` },
      );
      assert.match(await result.innerText(), /qualified geotechnical engineer/);
      await shot(page, 'section-study');
    });
  },
);
