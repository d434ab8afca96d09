/** Sign-in, the links and pages of each role, sign-out, and the way back after a deep link. */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const { USERS, api, launch, scenario, shot, signIn, tokenOf } = require('./support');

/** The links of the bar, by role (app.ts); the integration role never signs in. */
const LINKS = {
  admin: ['Projects', 'To review', 'Users', 'API tokens'],
  engineer: ['Projects'],
  reviewer: ['Projects', 'To review'],
  viewer: ['Projects'],
};

let browser;
before(async () => {
  browser = await launch();
});
after(() => browser?.close());

/** The words of the bar's links, without their icons' ligatures. */
function linkTexts(page) {
  return page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link')
    .evaluateAll((links) =>
      links.map((a) => {
        const copy = a.cloneNode(true);
        copy.querySelectorAll('mat-icon').forEach((i) => i.remove());
        return copy.textContent.trim();
      }),
    );
}

async function signOut(page) {
  await page.getByRole('button', { name: /^Signed in as / }).click();
  await page.getByRole('menuitem', { name: /Sign out/ }).click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
}

for (const role of Object.keys(LINKS)) {
  test(`${role}: sees the role in the bar and only its links; signs out`, async () => {
    await scenario(browser, `role ${role}`, async ({ page }) => {
      await page.goto('/sign-in');
      await page.getByRole('heading', { name: 'Sign in to Scarpline' }).waitFor();
      if (role === 'engineer') await shot(page, 'sign-in');
      await signIn(page, role, { alreadyThere: true });
      assert.equal(new URL(page.url()).pathname, '/projects');
      assert.equal((await page.getByTestId('role').innerText()).trim(), role);
      assert.match(
        (await page.getByRole('button', { name: /^Signed in as / }).innerText()).trim(),
        new RegExp(USERS[role].name),
      );
      assert.deepEqual(await linkTexts(page), LINKS[role]);
      if (role === 'engineer') {
        await page.getByText('Wendlecombe bypass').first().waitFor();
        await shot(page, 'projects');
      }
      await signOut(page);
      assert.equal(await page.getByTestId('role').count(), 0);
      // The session is gone: a page that needs one sends back to sign-in.
      await page.goto('/projects');
      await page.waitForURL((url) => url.pathname === '/sign-in');
    });
  });
}

test('viewer: opening /admin/users shows "Not allowed", and the API refuses too', async () => {
  await scenario(browser, 'viewer not allowed', async ({ page }) => {
    await signIn(page, 'viewer');
    await page.goto('/admin/users');
    await page.getByRole('heading', { name: 'Not allowed' }).waitFor();
    assert.equal(new URL(page.url()).pathname, '/not-allowed');
    assert.equal(await page.getByTestId('user-table').count(), 0);
    assert.equal((await api(await tokenOf(page), '/users')).status, 403);
  });
});

test('a wrong password shows the error and stays on sign-in', async () => {
  await scenario(browser, 'wrong password', async ({ page, allowStatus }) => {
    allowStatus(401);
    await signInExpectingRefusal(page, { ...USERS.engineer, password: 'not-the-password' });
    const alert = page.getByRole('alert');
    await alert.waitFor();
    assert.match(await alert.innerText(), /Wrong e-mail or password/);
    assert.equal(new URL(page.url()).pathname, '/sign-in');
    assert.equal(await page.getByTestId('role').count(), 0);
    // What was typed stays, to correct it.
    assert.equal(await page.getByLabel('E-mail').inputValue(), USERS.engineer.email);
  });
});

test('a deep link when signed out goes to sign-in, and back there after', async () => {
  await scenario(browser, 'deep link', async ({ page }) => {
    await page.goto('/admin/users');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    assert.equal(new URL(page.url()).searchParams.get('next'), '/admin/users');
    await signIn(page, 'admin', { alreadyThere: true });
    assert.equal(new URL(page.url()).pathname, '/admin/users');
    await page.getByTestId('user-table').waitFor();
  });
});

async function signInExpectingRefusal(page, user) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

test('the keyboard alone: sign in, reach a project and a batch, open a section from the table', async () => {
  await scenario(browser, 'keyboard', async ({ page }) => {
    const focused = () =>
      page.evaluate(() => {
        // eslint-disable-next-line no-undef
        const el = document.activeElement;
        return `${el?.tagName.toLowerCase()} ${(el?.getAttribute('aria-label') ?? el?.textContent ?? '').trim()}`;
      });
    /** Presses Tab until the focused element matches, at most `limit` times. */
    async function tabTo(pattern, limit = 40) {
      for (let i = 0; i < limit; i++) {
        await page.keyboard.press('Tab');
        if (pattern.test(await focused())) return;
      }
      throw new Error(`Tab never reached ${pattern} (last: ${await focused()})`);
    }
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in to Scarpline' }).waitFor();
    await tabTo(/^input/);
    await page.keyboard.type(USERS.viewer.email);
    await page.keyboard.press('Tab');
    await page.keyboard.type(USERS.viewer.password);
    assert.equal(await page.getByLabel('E-mail').inputValue(), USERS.viewer.email);
    assert.equal(await page.getByLabel('Password').inputValue(), USERS.viewer.password);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/projects', { timeout: 30_000 });
    await page
      .getByRole('link', { name: /Wendlecombe bypass/ })
      .first()
      .waitFor();
    await tabTo(/Wendlecombe bypass/);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => /^\/projects\/\d+$/.test(url.pathname));
    await page.getByTestId('batch-link').first().waitFor();
    await tabTo(/^a wcb-main/);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => /^\/batches\/\d+$/.test(url.pathname));
    await page.getByTestId('section-row').first().waitFor();
    await tabTo(/^a wcb-main@/, 120);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => /^\/sections\/\d+$/.test(url.pathname));
    await page.getByTestId('section-drawing').locator('svg').first().waitFor();
  });
});
