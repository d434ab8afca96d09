/** The harness's own checks can fail: a console error or a request elsewhere fails a scenario. */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const { launch, scenario } = require('./support');

let browser;
before(async () => {
  browser = await launch();
});
after(() => browser?.close());

const quiet = { shotOnFailure: false };

function failsWith(pattern) {
  return (err) => {
    assert.match(JSON.stringify(err.actual ?? err.message), pattern);
    return true;
  };
}

test('a console error in the page fails the scenario', async () => {
  await assert.rejects(
    scenario(
      browser,
      'harness console',
      async ({ page }) => {
        await page.goto('/sign-in');
        await page.evaluate("console.error('planted error')");
      },
      quiet,
    ),
    failsWith(/console error: planted error/),
  );
});

test('a request to another host fails the scenario, and is refused before it leaves', async () => {
  await assert.rejects(
    scenario(
      browser,
      'harness request',
      async ({ page }) => {
        await page.goto('/sign-in');
        // A navigation: the API's Content-Security-Policy already stops fetches and images.
        const failed = page.waitForEvent('requestfailed', (r) => r.url().includes('elsewhere'));
        await page.evaluate("location.href = 'http://elsewhere.invalid/x'");
        assert.match((await failed).failure().errorText, /BLOCKED_BY_CLIENT/);
      },
      quiet,
    ),
    failsWith(/request to another host: GET http:\/\/elsewhere\.invalid\/x/),
  );
});

test('a clean page passes', async () => {
  await scenario(browser, 'harness clean', async ({ page }) => {
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in to Scarpline' }).waitFor();
  });
});
