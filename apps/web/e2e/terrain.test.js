/**
 * Sections cut from a terrain model, as the GIS team submits them: the demo valley's raster,
 * alignment and ground-model raster chosen on the submit page, the corridor cut and run, the
 * same verdicts as `scarpline batch` of the same terrain job gives.
 */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');
const YAML = require('yaml');
const { eventually, launch, scenario, shot, signIn } = require('./support');

const TERRAIN = path.resolve(__dirname, '../../../examples/terrain');
/** The job's own numbers (examples/terrain/wendlecombe.terrain.yaml), typed into the form. */
const JOB = YAML.parse(fs.readFileSync(path.join(TERRAIN, 'wendlecombe.terrain.yaml'), 'utf8'));

let browser;
let settingsFile;
before(async () => {
  browser = await launch();
  // The corridor settings as a file of their own, as the form takes them.
  settingsFile = path.join(os.tmpdir(), `wendlecombe-settings-${process.pid}.yaml`);
  fs.writeFileSync(settingsFile, YAML.stringify(JOB.template));
});
after(() => {
  fs.rmSync(settingsFile, { force: true });
  return browser?.close();
});

test(
  'engineer: cuts the demo valley from its terrain model on the submit page and runs it',
  { timeout: 180_000 },
  async () => {
    await scenario(browser, 'terrain', async ({ page }) => {
      await signIn(page, 'engineer');
      await page.getByRole('link', { name: 'Wendlecombe bypass' }).first().click();
      await page.getByTestId('submit-link').click();
      await page.getByTestId('terrain-raster').setInputFiles(path.join(TERRAIN, JOB.terrain));
      await page.getByTestId('terrain-alignment').setInputFiles(path.join(TERRAIN, JOB.alignment));
      await page.getByTestId('terrain-settings').setInputFiles(settingsFile);
      const numbers = {
        'terrain-start': 1000,
        'terrain-every': JOB.stations.every,
        'terrain-left': JOB.left,
        'terrain-right': JOB.right,
        'terrain-spacing': JOB.spacing,
        'terrain-water': JOB.water.depth,
      };
      for (const [id, v] of Object.entries(numbers)) await page.getByTestId(id).fill(String(v));
      await page.locator('summary', { hasText: 'A lower stratum' }).click();
      await page.getByTestId('terrain-top-material').fill(JOB.strata[0].material);
      await page.getByTestId('terrain-rock-material').fill(JOB.strata[1].material);
      await page
        .getByTestId('terrain-rock')
        .setInputFiles(path.join(TERRAIN, JOB.strata[1].raster));
      await shot(page, 'terrain-form');
      await page.getByTestId('terrain-submit').click();

      await page.waitForURL(/\/batches\/\d+$/, { timeout: 60_000 });
      const status = page.getByTestId('batch-status');
      await eventually(async () => /\bdone\b/i.test(await status.innerText()), {
        timeout: 150_000,
        interval: 500,
        what: 'the batch cut from the terrain to be done',
      });
      // scarpline batch examples/terrain/wendlecombe.terrain.yaml: 30 sections, 28 meet, 2 below
      const text = (await page.locator('main').innerText()).replace(/\s+/g, ' ');
      assert.match(text, /30 done · 0 failed · 30 total/);
      assert.match(text, /2 below the required FS/);
      await shot(page, 'terrain-batch');
    });
  },
);
