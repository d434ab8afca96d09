/**
 * The way a corridor goes through Scarpline, one step after the other: an engineer submits the
 * corridor file and watches it finish; the failing sections are found and opened; a reviewer
 * signs one off; a viewer reads it without the review buttons; the reviewer signs the whole
 * batch off and downloads its corridor report, which records the sign-off.
 */
const { execFileSync } = require('node:child_process');
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');
const { NARROW, api, eventually, launch, scenario, shot, signIn, tokenOf } = require('./support');

const CORRIDOR = path.resolve(__dirname, '../../../examples/corridor/corridor.json');
const STATIONS = 61;
/** A section file with a missing field and a word where a number belongs. */
const BAD_PASTE = [
  'format: scarpline/1',
  'id: e2e-bad',
  'units: si',
  'ground:',
  '  - [0, 10]',
  '  - [x, 5]',
  '',
].join('\n');

let browser;
/** Set as the steps go: the new batch, its failing stations, the section opened. */
const found = { batchId: null, belowRequired: null, sectionId: null };

before(async () => {
  browser = await launch();
});
after(() => browser?.close());

/** "58 done · 3 failed · 61 total" → { done, failed, total } */
function progressNumbers(text) {
  const n = (word) => Number(new RegExp(`(\\d+)\\s*${word}`, 'i').exec(text)?.[1]);
  return { done: n('done'), failed: n('failed'), total: n('total') };
}

/** Chooses "Below" (the required FS) in the batch table's filter (a select or a group of toggles). */
async function filterFail(page) {
  const filter = page.getByTestId('pass-filter');
  const tag = await filter.evaluate((e) => e.tagName.toLowerCase());
  if (tag === 'mat-select') {
    await filter.click();
    await page.getByRole('option', { name: 'Below', exact: true }).click();
  } else {
    await filter.getByText('Below', { exact: true }).click();
  }
}

async function failingRows(page, expected) {
  await filterFail(page);
  const rows = page.getByTestId('section-row');
  await eventually(
    async () => {
      const texts = await rows.allInnerTexts();
      return texts.length === expected && texts.every((t) => /\bbelow\b/i.test(t));
    },
    { what: `${expected} rows, each marked as failing` },
  );
  return rows;
}

test(
  'engineer: submits the corridor file and watches it finish',
  { timeout: 150_000 },
  async () => {
    await scenario(browser, 'submit corridor', async ({ page, allowStatus }) => {
      await signIn(page, 'engineer');
      await page.getByRole('link', { name: 'Wendlecombe bypass' }).first().click();
      await page.getByTestId('batch-list').waitFor();
      await shot(page, 'project');
      await page.getByTestId('submit-link').click();
      await page.getByTestId('paste-input').waitFor();

      // A bad paste: the API's located errors, and the text stays to be corrected.
      allowStatus(400, 422);
      await page.getByTestId('paste-input').fill(BAD_PASTE);
      await page.getByTestId('submit-button').click();
      const errors = page.getByTestId('located-errors');
      await errors.waitFor();
      const said = await errors.innerText();
      assert.match(said, /ground\[1\]\[0\]/, 'the path of the wrong value');
      assert.match(said, /(line\s*|:)6\b/, 'the line of the wrong value');
      assert.equal(await page.getByTestId('paste-input').inputValue(), BAD_PASTE);
      assert.match(new URL(page.url()).pathname, /\/submit$/, 'still on the submit page');
      await shot(page, 'submit-error');

      // The corridor file through the file input.
      await page.getByTestId('paste-input').fill('');
      await page.getByTestId('file-input').setInputFiles(CORRIDOR);
      await page.getByTestId('submit-button').click();
      await page.waitForURL(/\/batches\/\d+$/, { timeout: 30_000 });
      found.batchId = Number(/\/batches\/(\d+)$/.exec(page.url())[1]);

      const status = page.getByTestId('batch-status');
      await eventually(async () => /\bdone\b/i.test(await status.innerText()), {
        timeout: 120_000,
        interval: 500,
        what: 'the batch status to say done',
      });
      const progress = page.getByTestId('batch-progress');
      const p = await eventually(
        async () => {
          const n = progressNumbers(await progress.innerText());
          return n.total === STATIONS && n.done + n.failed === STATIONS ? n : null;
        },
        { what: `done + failed = ${STATIONS} in the progress` },
      );
      assert.equal(p.total, STATIONS);

      // What the page should show, from the API: the corridor has stations below the required FS.
      const batch = await api(await tokenOf(page), `/batches/${found.batchId}`);
      assert.equal(batch.status, 200);
      assert.equal(batch.body.progress.total, STATIONS);
      found.belowRequired = batch.body.progress.belowRequiredFs;
      assert.ok(found.belowRequired >= 1, 'the corridor has failing stations');

      const rows = page.getByTestId('section-row');
      await rows.first().waitFor();
      assert.ok((await rows.count()) >= 10, 'the table lists the stations');
      assert.match(await rows.first().innerText(), /1000/, 'the first station, 1000');
      await page.getByTestId('chainage-chart').first().waitFor();
      // One chart of the governing FS, or one a design case when the corridor has several,
      // each marking the stations below the requirement (of its case). The charts follow the
      // sections' list, which may still be taking the last results in.
      const cases = (batch.body.cases ?? []).length > 1 ? batch.body.cases : [null];
      for (const [i, name] of cases.entries()) {
        const below = name === null ? found.belowRequired : batch.body.caseCounts[name]?.below;
        const chart = page.locator('sl-chainage-chart').nth(i);
        await eventually(
          async () => (await chart.getByTestId('fail-marker').count()) === (below ?? 0),
          { what: `one marker per failing station (${below ?? 0}) in ${name ?? 'the chart'}` },
        );
        // the core's chart: its legend counts each mark in the core's words
        assert.match(
          await chart.innerText(),
          new RegExp(`below the required FS \\(${below ?? 0}\\)`),
          'the legend counts the stations below the required FS',
        );
      }
      await shot(page, 'batch');
      await page.setViewportSize(NARROW);
      await shot(page, 'batch-narrow');
    });
  },
);

test('engineer: filters to the failing sections and opens the first', async () => {
  assert.ok(found.batchId, 'the batch of the step before');
  await scenario(browser, 'open failing section', async ({ page }) => {
    await signIn(page, 'engineer');
    await page.goto(`/batches/${found.batchId}`);
    const rows = await failingRows(page, found.belowRequired);
    await rows.first().getByRole('link').first().click();
    await page.waitForURL(/\/sections\/\d+$/);
    found.sectionId = Number(/\/sections\/(\d+)$/.exec(page.url())[1]);

    const drawing = page.getByTestId('section-drawing');
    await drawing.locator('svg').first().waitFor();
    const svg = await drawing
      .locator('svg')
      .first()
      .evaluate((s) => s.outerHTML);
    assert.ok(
      /class="[^"]*critical/.test(svg) || /critical surface/i.test(svg),
      'the drawing shows the critical surface',
    );
    // its FS in a callout at the arc, the materials by their descriptions, no radius lines,
    // the FS map as contours and the trial surfaces within a band of the least FS
    assert.match(svg, /class="fs-callout"[\s\S]*?>FS \d\.\d{3} \(/, 'the FS in a callout');
    assert.match(svg, /Highly weathered MUDSTONE/, 'a material by its description');
    assert.doesNotMatch(svg, /stroke-dasharray="2 3"/, 'no radius lines');
    assert.match(svg, /class="fs-map-extent"/, 'the FS map and its extent');
    assert.match(svg, /trial surfaces within 5 % of the/, 'the trial band');
    assert.doesNotMatch(svg, /lowest trial surfaces/);
    assert.ok((await page.getByTestId('method-table').locator('tr').count()) >= 2, 'method rows');
    assert.ok((await page.getByTestId('slice-table').locator('tr').count()) >= 2, 'slice rows');
    // Bishop's simplified (the governing method here) computes no interslice force: — and a note
    const note = page.getByTestId('interslice-note');
    if (await note.count()) assert.match(await note.innerText(), /does not compute E and X/);
    assert.doesNotMatch(
      await page.getByTestId('method-table').innerText(),
      /\bAlso\b/,
      'the methods table names what its last column holds',
    );
    await page.getByRole('note', { name: 'Engineering caution' }).waitFor();
    assert.equal(await page.getByRole('note', { name: 'Engineering caution' }).isVisible(), true);

    await page.getByTestId('review-state').waitFor();
    await shot(page, 'section');
    await page.setViewportSize(NARROW);
    await shot(page, 'section-narrow');

    // An engineer (here also the submitter) sees the review state but cannot sign off.
    assert.equal(await page.getByTestId('sign-off').count(), 0);
    assert.equal(await page.getByTestId('return').count(), 0);
    assert.match(await page.getByTestId('review-state').first().innerText(), /pending/i);
  });
});

test('engineer: a reinforced station shows its geogrids drawn and listed, and the basal force it needs', async () => {
  assert.ok(found.batchId, 'the batch of the first step');
  await scenario(browser, 'reinforced section', async ({ page }) => {
    await signIn(page, 'engineer');
    // the demo corridor's highest fill (1+720) has geogrids; its end-of-construction case governs
    const list = await api(await tokenOf(page), `/batches/${found.batchId}/sections?pageSize=100`);
    const item = list.body.items.find((s) => s.station === 1720);
    assert.ok(item, 'station 1+720 in the batch');
    const section = await api(await tokenOf(page), `/sections/${item.id}`);
    const shown = section.body.result.cases.find(
      (c) => c.name === section.body.result.governingCase,
    );
    await page.goto(`/sections/${item.id}`);
    const table = page.getByTestId('reinforcement-table');
    await table.waitFor();
    const listed = await table.innerText();
    assert.match(listed, /geogrid at 32\.67 m/, 'the geogrids listed by name');
    assert.match(listed, /tensile strength|pullout/, 'what limits a force, in words');
    const svg = await page
      .getByTestId('section-drawing')
      .locator('svg')
      .first()
      .evaluate((e) => e.outerHTML);
    assert.match(svg, /kN\/m, (tensile strength|pullout)/, 'a force drawn at its crossing');
    // the required basal force, as the API gives it for the case shown
    const required = page.getByTestId('required-reinforcement');
    await required.waitFor();
    const value = shown.requiredReinforcement.value;
    assert.match(await required.innerText(), new RegExp(value.toFixed(1).replace('.', '\\.')));
    await page.getByRole('note', { name: 'Engineering caution' }).waitFor();
    await shot(page, 'section-reinforced');
  });
});

test('reviewer: signs the section off with a comment; the batch table shows it', async () => {
  assert.ok(found.sectionId, 'the section of the step before');
  await scenario(browser, 'sign off', async ({ page }) => {
    await signIn(page, 'reviewer');
    await page.getByRole('link', { name: 'To review' }).click();
    await page.getByTestId('review-queue').waitFor();
    await shot(page, 'review-queue');

    await page.goto(`/sections/${found.sectionId}`);
    const state = page.getByTestId('review-state');
    await state.waitFor();
    assert.match(await state.innerText(), /pending/i);
    await page
      .getByTestId('review-comment')
      .fill('Checked the critical surface and the strengths.');
    await page.getByTestId('sign-off').click();
    await eventually(async () => /approved/i.test(await state.innerText()), {
      what: 'the review state to say approved',
    });

    const section = await api(await tokenOf(page), `/sections/${found.sectionId}`);
    assert.equal(section.status, 200);
    assert.match(JSON.stringify(section.body), /approved/);

    await page.goto(`/batches/${found.batchId}`);
    const rows = await failingRows(page, found.belowRequired);
    const row = rows.filter({ has: page.locator(`a[href$="/sections/${found.sectionId}"]`) });
    assert.equal(await row.count(), 1, 'the row of the section');
    assert.match(await row.innerText(), /approved/i);
  });
});

test('viewer: reads the same section without the review buttons', async () => {
  assert.ok(found.sectionId, 'the section of the steps before');
  await scenario(browser, 'viewer section', async ({ page }) => {
    await signIn(page, 'viewer');
    await page.goto(`/sections/${found.sectionId}`);
    await page.getByTestId('section-drawing').locator('svg').first().waitFor();
    const state = page.getByTestId('review-state');
    await state.waitFor();
    assert.match(await state.innerText(), /approved/i);
    assert.equal(await page.getByTestId('sign-off').count(), 0);
    assert.equal(await page.getByTestId('return').count(), 0);
    await page.getByRole('note', { name: 'Engineering caution' }).waitFor();
  });
});

test('reviewer: signs the whole batch off and downloads the signed corridor report from the batch page', async () => {
  assert.ok(found.batchId, 'the batch of the first step');
  await scenario(browser, 'corridor report', async ({ page }) => {
    await signIn(page, 'reviewer');
    await page.goto(`/batches/${found.batchId}`);
    const state = page.getByTestId('review-state');
    await state.waitFor();
    const comment = 'Corridor checked station by station against the ground model.';
    await page.getByTestId('review-comment').fill(comment);
    await page.getByTestId('sign-off').click();
    await eventually(async () => /approved/i.test(await state.innerText()), {
      what: 'the batch review to say approved',
    });

    await page.getByTestId('make-report').click();
    const row = page.getByTestId('report-row').first();
    await row.waitFor();
    await eventually(async () => /done/i.test(await row.getByTestId('report-status').innerText()), {
      timeout: 120_000,
      interval: 1000,
      what: 'the corridor report to be made',
    });
    await shot(page, 'corridor-report');
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      row.getByTestId('download-report').click(),
    ]);
    assert.match(download.suggestedFilename(), /corridor-report.*\.pdf$/);
    const file = path.join(os.tmpdir(), `scarpline-e2e-${process.pid}.pdf`);
    await download.saveAs(file);
    try {
      const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' });
      const flat = text.replace(/\s+/g, ' ');
      assert.match(flat, /Rhea Reviewer/, 'the reviewer in the report');
      assert.match(flat, /approved/i);
      assert.ok(flat.includes(comment), 'the review comment in the report');
      const pages = text.split('\f').filter((p) => p.trim() !== '');
      pages.forEach((p, i) => {
        assert.match(
          p.replace(/\s+/g, ' '),
          /qualified geotechnical engineer/,
          `the caution on page ${i + 1}`,
        );
        assert.ok(p.includes(`${i + 1} of ${pages.length}`), `"n of m" on page ${i + 1}`);
      });
    } finally {
      fs.rmSync(file, { force: true });
    }
  });
});
