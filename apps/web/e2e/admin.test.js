/**
 * The admin pages: invite a user (who then signs in with the mailed one-time password), change
 * a role, disable and enable with a confirmation, never oneself; create an API token that is
 * shown once and works, then revoke it.
 */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const { api, eventually, launch, scenario, shot, signIn, tokenOf } = require('./support');

const INVITEE = { name: 'Nia Checker', email: 'nia.checker@wendlecombe.example' };
/** The password the invitee chooses in place of the mailed one at the first sign-in. */
const OWN_PASSWORD = 'nia-own-password-2931';

let browser;
before(async () => {
  browser = await launch();
});
after(() => browser?.close());

function rowOf(page, text) {
  return page.getByTestId('user-row').filter({ hasText: text });
}

/** Opens a mat-select by its field, as a user clicks it (its label may lie over it), and picks. */
async function pick(page, select, option) {
  await select.locator('xpath=ancestor::mat-form-field').click();
  await page.getByRole('option', { name: option, exact: true }).click();
}

/** The one-time password in the invitation the API's SMTP fake received. */
async function mailedPassword(adminToken, email) {
  return eventually(
    async () => {
      const { status, body } = await api(adminToken, '/mail');
      assert.equal(status, 200);
      const mail = body.find((m) => m.to.includes(email));
      return mail && /Password: ([A-Za-z0-9]+)/.exec(mail.raw)?.[1];
    },
    { what: `the invitation to ${email}` },
  );
}

test('users: lists the accounts; the admin cannot disable or demote themselves', async () => {
  await scenario(browser, 'users list', async ({ page }) => {
    await signIn(page, 'admin');
    await page.getByRole('link', { name: 'Users' }).click();
    await page.getByTestId('user-table').waitFor();
    const rows = await page.getByTestId('user-row').allInnerTexts();
    for (const email of ['admin@', 'engineer@', 'reviewer@', 'viewer@', 'gis-feed@']) {
      assert.ok(
        rows.some((r) => r.includes(`${email}wendlecombe.example`)),
        `a row for ${email}`,
      );
    }
    const me = rowOf(page, 'admin@wendlecombe.example');
    assert.equal(await me.getByTestId('toggle-active').isDisabled(), true);
    assert.equal(await me.getByTestId('role-select').getAttribute('aria-disabled'), 'true');
    assert.match(await me.innerText(), /cannot disable or demote yourself/);
    const other = rowOf(page, 'engineer@wendlecombe.example');
    assert.equal(await other.getByTestId('toggle-active').isDisabled(), false);
  });
});

test('users: an invitation is mailed, and the invitee signs in with its password', async () => {
  let password;
  await scenario(browser, 'invite', async ({ page, allowStatus }) => {
    await signIn(page, 'admin');
    await page.goto('/admin/users');
    const form = page.getByTestId('invite-form');
    await form.getByLabel('Name').fill(INVITEE.name);
    await form.getByLabel('E-mail').fill(INVITEE.email);
    await pick(page, page.getByTestId('invite-role'), 'reviewer');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    const outcome = page.getByTestId('invite-outcome');
    await outcome.waitFor();
    assert.match(await outcome.innerText(), new RegExp(`Invitation sent to ${INVITEE.email}`));
    await rowOf(page, INVITEE.email).waitFor();

    // The same address again: the API's words, and the form keeps what was typed.
    allowStatus(409);
    await form.getByLabel('Name').fill('Nia Twice');
    await form.getByLabel('E-mail').fill(INVITEE.email);
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await eventually(async () => /exists already/.test(await outcome.innerText()), {
      what: 'the conflict to be shown',
    });
    assert.equal(await outcome.getAttribute('role'), 'alert');
    assert.equal(await form.getByLabel('Name').inputValue(), 'Nia Twice');
    assert.equal(await page.getByTestId('user-row').filter({ hasText: INVITEE.email }).count(), 1);
    await shot(page, 'users');

    password = await mailedPassword(await tokenOf(page), INVITEE.email);
  });
  assert.ok(password && password.length >= 12, 'a generated password in the mail');
  await scenario(browser, 'invitee signs in', async ({ page }) => {
    await signIn(page, { email: INVITEE.email, password });
    assert.equal((await page.getByTestId('role').innerText()).trim(), 'reviewer');
    // The mailed password is replaced before anything else.
    await page.waitForURL((url) => url.pathname === '/account/password');
    await page.getByTestId('must-change').waitFor();
    await shot(page, 'first-sign-in');
    const form = page.getByTestId('change-password');
    await form.getByLabel('Current password').fill(password);
    await form.getByLabel('New password', { exact: true }).fill(OWN_PASSWORD);
    await form.getByLabel('New password again').fill(OWN_PASSWORD);
    await form.getByRole('button', { name: 'Change password' }).click();
    await page.waitForURL((url) => url.pathname === '/projects');
  });
  await scenario(browser, 'invitee signs in with their own password', async ({ page }) => {
    await signIn(page, { email: INVITEE.email, password: OWN_PASSWORD });
    await page.waitForURL((url) => url.pathname === '/projects');
  });
});

test('users: a role change holds; a disabled user cannot sign in until enabled', async () => {
  const password = OWN_PASSWORD;
  await scenario(browser, 'role and disable', async ({ page }) => {
    await signIn(page, 'admin');
    await page.goto('/admin/users');
    await pick(page, rowOf(page, INVITEE.email).getByTestId('role-select'), 'viewer');
    const notice = page.getByTestId('user-notice');
    await notice.waitFor();
    assert.match(await notice.innerText(), /Nia Checker is now viewer/);
    await page.reload();
    await page.getByTestId('user-table').waitFor();
    assert.match(await rowOf(page, INVITEE.email).getByTestId('role-select').innerText(), /viewer/);

    // Disable: only after the confirmation.
    await rowOf(page, INVITEE.email).getByTestId('toggle-active').click();
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    assert.match(await dialog.innerText(), /Disable Nia Checker\?/);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'detached' });
    assert.match(await rowOf(page, INVITEE.email).getByTestId('user-active').innerText(), /Active/);
    await rowOf(page, INVITEE.email).getByTestId('toggle-active').click();
    await page.getByTestId('confirm').click();
    await eventually(
      async () =>
        /Disabled/.test(await rowOf(page, INVITEE.email).getByTestId('user-active').innerText()),
      { what: 'the row to say Disabled' },
    );
  });

  await scenario(browser, 'disabled user refused', async ({ page, allowStatus }) => {
    allowStatus(401);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(INVITEE.email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').waitFor();
    assert.match(await page.getByRole('alert').innerText(), /Wrong e-mail or password/);
  });

  await scenario(browser, 'enable again', async ({ page }) => {
    await signIn(page, 'admin');
    await page.goto('/admin/users');
    await rowOf(page, INVITEE.email).getByTestId('toggle-active').click();
    await page.getByTestId('confirm').click();
    await eventually(
      async () =>
        /Active/.test(await rowOf(page, INVITEE.email).getByTestId('user-active').innerText()),
      { what: 'the row to say Active' },
    );
  });
  await scenario(browser, 'enabled user signs in', async ({ page }) => {
    await signIn(page, { email: INVITEE.email, password });
    assert.equal((await page.getByTestId('role').innerText()).trim(), 'viewer');
  });
});

test('tokens: a new token is shown once, works, and stops working when revoked', async () => {
  await scenario(browser, 'tokens', async ({ page, context }) => {
    await context.grantPermissions(['clipboard-read', 'clipboard-write']);
    await signIn(page, 'admin');
    await page.getByRole('link', { name: 'API tokens' }).click();
    const form = page.getByTestId('create-token');
    await form.waitFor();
    await pick(page, page.getByTestId('token-user'), 'GIS feed (gis-feed@wendlecombe.example)');
    await form.getByLabel('Name').fill('E2E feed');
    await page.getByTestId('token-projects').locator('xpath=ancestor::mat-form-field').click();
    await page.getByRole('option', { name: 'Wendlecombe bypass' }).click();
    await page.keyboard.press('Escape');
    await form.getByLabel('Valid for (days)').fill('30');
    await form.getByRole('button', { name: 'Create token' }).click();

    const once = page.getByTestId('token-once');
    await once.waitFor();
    assert.match(await once.innerText(), /it will not be shown again/);
    const token = (await page.getByTestId('token-value').innerText()).trim();
    assert.match(token, /^sli_/);
    await page.getByTestId('copy-token').click();
    await once.getByText('Copied to the clipboard.').waitFor();
    assert.equal(await page.evaluate('navigator.clipboard.readText()'), token);
    await shot(page, 'tokens-created');

    // The token works for its project.
    const projects = await api(token, '/projects');
    assert.equal(projects.status, 200);
    assert.deepEqual(
      projects.body.map((p) => p.name),
      ['Wendlecombe bypass'],
    );

    await page.getByTestId('close-token').click();
    await once.waitFor({ state: 'detached' });
    assert.equal((await page.content()).includes(token), false, 'the token is gone from the page');

    await page.reload();
    const row = page.getByTestId('token-row').filter({ hasText: 'E2E feed' });
    await row.waitFor();
    const text = await row.innerText();
    assert.match(text, /GIS feed/);
    assert.match(text, /Wendlecombe bypass/);
    assert.match(text, /Active/);
    assert.doesNotMatch(text, /never/, 'used once above, so it has a last use');

    await row.getByTestId('revoke-token').click();
    await page.getByTestId('confirm').click();
    await eventually(async () => /Revoked/.test(await row.getByTestId('token-state').innerText()), {
      what: 'the token to say Revoked',
    });
    await shot(page, 'tokens');
    assert.equal((await api(token, '/projects')).status, 401);
  });
});
