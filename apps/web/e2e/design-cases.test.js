/**
 * A corridor under two design cases, as a checker reads it: the batch page charts each case
 * along the chainage with its own failing stations, the table opens a station to every case
 * and filters by one case's verdict, and the section page draws the case picked.
 */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const fs = require('node:fs');
const path = require('node:path');
const { api, eventually, launch, scenario, shot, signIn, submitToDemo } = require('./support');

const CORRIDOR = path.resolve(__dirname, '../../../examples/corridor/corridor.json');
const STATIONS = 8;
const CASES = ['long term', 'surcharge'];

/**
 * The first stations of the demo corridor under our own two cases: the long term as the
 * corridor asks it, and a surcharge whose requirement is set high on purpose (4.0), so that
 * it fails stations the long term does not and a checker has something to tell apart.
 */
function corridorWithCases() {
  const c = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8'));
  c.id = 'wcb-cases';
  c.title = 'Wendlecombe bypass, two design cases';
  c.sections = c.sections.slice(0, STATIONS);
  c.template.cases = [
    { name: CASES[0], kind: 'long-term', requiredFs: 1.5 },
    {
      name: CASES[1],
      kind: 'surcharge',
      requiredFs: 4,
      loads: [{ type: 'strip', from: 0, to: 7.3, pressure: 30 }],
    },
  ];
  return JSON.stringify(c, null, 2);
}

/** Chooses whose verdict the table filters by (the select opened again until it shows). */
async function chooseCase(page, name) {
  const select = page.getByTestId('case-filter');
  const option = page.getByRole('option', { name: `case ${name}`, exact: true });
  await eventually(
    async () => {
      if (!(await option.isVisible())) await select.click();
      return option.isVisible();
    },
    { what: `the choice of the case ${name}` },
  );
  await option.click();
  await page.getByRole('listbox').waitFor({ state: 'detached' });
}

let browser;
before(async () => {
  browser = await launch();
});
after(() => browser?.close());

test(
  'engineer: a corridor of two design cases, by case on the batch and the section pages',
  { timeout: 210_000 },
  async () => {
    await scenario(browser, 'design cases', async ({ page }) => {
      await signIn(page, 'engineer');
      const { token, batchId } = await submitToDemo(page, corridorWithCases(), 120_000);

      // What the page should show, from the API: each case's stations below its requirement.
      const batch = await api(token, `/batches/${batchId}`);
      assert.deepEqual(batch.body.cases, CASES);
      const below = {};
      for (const name of CASES) {
        const q = `?case=${encodeURIComponent(name)}&verdict=below&pageSize=500`;
        const r = await api(token, `/batches/${batchId}/sections${q}`);
        assert.equal(r.status, 200);
        below[name] = r.body.items.map((s) => s.key).sort();
        assert.equal(batch.body.caseCounts[name]?.below ?? 0, below[name].length);
      }
      assert.ok(
        below[CASES[1]].length > below[CASES[0]].length,
        'the surcharge case fails more stations than the long term',
      );
      const anyCase = new Set(Object.values(below).flat()).size;

      // A chart per case, each marking its own failing stations.
      const charts = page.getByTestId('case-chart');
      await eventually(async () => (await charts.count()) === CASES.length, {
        what: 'a chart per case',
      });
      for (const [i, name] of CASES.entries()) {
        const chart = charts.nth(i);
        assert.equal(await chart.getAttribute('data-case'), name);
        await eventually(
          async () => (await chart.getByTestId('fail-marker').count()) === below[name].length,
          { what: `${below[name].length} failing stations marked in the case ${name}` },
        );
      }
      assert.match(
        await page.getByTestId('cases-below').innerText(),
        new RegExp(`${anyCase} of \\d+ stations below the required FS in at least one case`),
      );

      // A row opens to every case; the governing one is marked.
      const first = page.getByTestId('section-row').first();
      await first.getByTestId('expand-cases').click();
      const cases = page.getByTestId('case-rows');
      await cases.waitFor();
      assert.equal(await cases.locator('tbody tr').count(), CASES.length);
      assert.match(await cases.innerText(), /governing/);
      await shot(page, 'batch-cases');

      // Filter: the stations below in one case, then in the other.
      await page.getByTestId('pass-filter').getByText('Below', { exact: true }).click();
      const rowKeys = async () =>
        (await page.getByTestId('section-row').locator('a').allInnerTexts()).sort();
      for (const name of [CASES[1], CASES[0]]) {
        await chooseCase(page, name);
        await eventually(
          async () => JSON.stringify(await rowKeys()) === JSON.stringify(below[name]),
          { what: `the ${below[name].length} stations below in the case ${name}` },
        );
      }

      // The section page: the cases side by side, the drawing of the case picked.
      await page.goto(`/batches/${batchId}`);
      await page.getByTestId('section-row').first().getByRole('link').first().click();
      await page.waitForURL(/\/sections\/\d+$/);
      const table = page.getByTestId('case-table');
      await table.waitFor();
      assert.equal(await table.locator('tbody tr').count(), CASES.length);
      const governing = await page.getByTestId('section-governing-case').innerText();
      const other = CASES.find((c) => c !== governing.trim());
      await table.locator(`tr[data-case="${other}"]`).getByTestId('pick-case').click();
      const drawing = page.getByTestId('section-drawing');
      await eventually(
        async () =>
          (await drawing.getAttribute('aria-label').catch(() => null)) ===
            `Cross-section drawing of the case ${other}` &&
          (await drawing.locator('svg').first().textContent()).includes(`case: ${other}`),
        { what: `the drawing of the case ${other}` },
      );
      await page.getByRole('note', { name: 'Engineering caution' }).waitFor();
      await shot(page, 'section-cases');

      // A checker lowers one case's required FS through the form; the next run's case follows.
      const row = table.locator(`tr[data-case="${CASES[1]}"]`);
      const cells = async () => (await row.locator('td').allInnerTexts()).map((t) => t.trim());
      const [, , fs, required, ratio] = await cells();
      assert.equal(required, '4');
      const rerun = page.getByTestId('rerun-case').filter({ hasText: `Case “${CASES[1]}”` });
      await rerun.getByLabel('Required FS').fill('1.2');
      await page.getByTestId('rerun-submit').click();
      await page.getByTestId('rerun-queued').waitFor();
      await eventually(async () => (await cells())[3] === '1.2', {
        timeout: 60_000,
        interval: 500,
        what: `the next run's ${CASES[1]} case to require 1.2`,
      });
      const now = await cells();
      assert.equal(now[2], fs, 'the same FS: only the requirement changed');
      assert.notEqual(now[4], ratio);
      // FS / required from the FS as shown (three decimals): within the rounding of both
      assert.ok(Math.abs(Number(now[4]) - Number(fs) / 1.2) < 0.002, `${now[4]} is ${fs} / 1.2`);
      await shot(page, 'section-case-rerun');
    });
  },
);
