/**
 * One's own password: a person changes it from the user menu (and signs in with the new one
 * only), and someone who forgot it asks for a link from the sign-in page, opens the link from
 * the mail (the API's SMTP fake), sets a new password and signs in with it; the link works once.
 * Each person here is made for the test by the admin, so the demo accounts stay as they are.
 */
const { after, before, test } = require('node:test');
const assert = require('node:assert/strict');
const { BASE_URL, USERS, api, eventually, launch, scenario, shot, signIn } = require('./support');

let browser;
let adminToken;
before(async () => {
  browser = await launch();
  const res = await fetch(`${BASE_URL}/api/v1/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: USERS.admin.email, password: USERS.admin.password }),
  });
  adminToken = (await res.json()).token;
});
after(() => browser?.close());

/** A person of role engineer with a password of the admin's choosing. */
async function person(email, name, password) {
  const res = await api(adminToken, '/users', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, name, role: 'engineer', password }),
  });
  assert.equal(res.status, 201, JSON.stringify(res.body));
}

async function signOut(page) {
  await page.getByRole('button', { name: /^Signed in as / }).click();
  await page.getByRole('menuitem', { name: /Sign out/ }).click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
}

/** Fills the sign-in form and presses the button, without waiting to get through. */
async function tryToSignIn(page, email, password) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

test('a person changes their password from the user menu; only the new one works after', async () => {
  const who = { email: 'cleo.change@wendlecombe.example', password: 'cleo-first-pw-4410' };
  const fresh = 'cleo-second-pw-8821';
  await person(who.email, 'Cleo Change', who.password);
  await scenario(browser, 'change password', async ({ page, allowStatus }) => {
    await signIn(page, who);
    await page.getByRole('button', { name: /^Signed in as / }).click();
    await page.getByRole('menuitem', { name: /Change password/ }).click();
    await page.waitForURL((url) => url.pathname === '/account/password');
    const form = page.getByTestId('change-password');

    // A wrong current password: the API's words, and nothing changed.
    allowStatus(403);
    await form.getByLabel('Current password').fill('not-my-password');
    await form.getByLabel('New password', { exact: true }).fill(fresh);
    await form.getByLabel('New password again').fill(fresh);
    await form.getByRole('button', { name: 'Change password' }).click();
    await eventually(
      async () => /current password is wrong/.test(await page.getByRole('alert').innerText()),
      { what: 'the refusal to be shown' },
    );

    await form.getByLabel('Current password').fill(who.password);
    await form.getByRole('button', { name: 'Change password' }).click();
    await page.getByTestId('password-changed').waitFor();
    await shot(page, 'password-changed');
    await signOut(page);
  });
  await scenario(browser, 'old password refused', async ({ page, allowStatus }) => {
    allowStatus(401);
    await tryToSignIn(page, who.email, who.password);
    await page.getByRole('alert').waitFor();
    assert.match(await page.getByRole('alert').innerText(), /Wrong e-mail or password/);
  });
  await scenario(browser, 'new password works', async ({ page }) => {
    await signIn(page, { email: who.email, password: fresh });
    await page.waitForURL((url) => url.pathname === '/projects');
  });
});

test('a forgotten password: a link by mail, a new password, the link used once', async () => {
  const who = { email: 'rory.reset@wendlecombe.example', password: 'rory-first-pw-1357' };
  const fresh = 'rory-new-pw-2468';
  await person(who.email, 'Rory Reset', who.password);
  await scenario(browser, 'ask for a link', async ({ page }) => {
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.waitForURL((url) => url.pathname === '/forgot-password');
    await page.getByLabel('E-mail').fill(who.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    const said = page.getByTestId('reset-asked');
    await said.waitFor();
    assert.match(await said.innerText(), /a link to set a new\s+password is on its way/);
    await shot(page, 'forgot-password');
  });

  // The link, from the mail the API's SMTP fake received (quoted-printable undone).
  const link = await eventually(
    async () => {
      const { body } = await api(adminToken, '/mail');
      const mail = body.filter((m) => m.to.includes(who.email)).pop();
      const text = mail?.raw.replace(/=\r?\n/g, '').replace(/=3D/g, '=');
      return text && /(http\S+\/reset-password#token=slr_[\w-]+)/.exec(text)?.[1];
    },
    { what: `the reset mail to ${who.email}` },
  );
  const url = new URL(link);
  assert.equal(url.origin, new URL(BASE_URL).origin, 'the link opens this web app');
  assert.equal(url.search, '', 'the token is in the fragment, never sent to a server');

  await scenario(browser, 'set a new password', async ({ page }) => {
    await page.goto(link);
    const form = page.getByTestId('reset-password');
    await form.waitFor();
    await form.getByLabel('New password', { exact: true }).fill(fresh);
    await form.getByLabel('New password again').fill(fresh);
    await shot(page, 'reset-password');
    await form.getByRole('button', { name: 'Set the password' }).click();
    const done = page.getByTestId('reset-done');
    await done.waitFor();
    assert.match(await done.innerText(), new RegExp(`Sign in as ${who.email}`));
    await page.getByRole('link', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in');
    await signIn(page, { email: who.email, password: fresh }, { alreadyThere: true });
  });

  await scenario(browser, 'the link works once', async ({ page, allowStatus }) => {
    allowStatus(400);
    await page.goto(link);
    const form = page.getByTestId('reset-password');
    await form.getByLabel('New password', { exact: true }).fill('rory-third-pw-9999');
    await form.getByLabel('New password again').fill('rory-third-pw-9999');
    await form.getByRole('button', { name: 'Set the password' }).click();
    await eventually(
      async () => /not valid: it was used already/.test(await page.getByRole('alert').innerText()),
      { what: 'the used link to be refused' },
    );
    assert.ok(await page.getByRole('link', { name: 'Ask for a new link' }).isVisible());
  });
});
