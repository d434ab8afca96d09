/**
 * What the browser tests share: Debian's chromium through playwright-core, a fresh browser
 * context per scenario, and the checks every scenario gets for free: the page requests nothing
 * from any host but the API's, the browser console shows no error, and every page a test takes
 * a screenshot of passes axe-core's WCAG 2 A and AA rules (contrast, names, labels, roles).
 */
const assert = require('node:assert/strict');
const fs = require('node:fs');
const path = require('node:path');
const { chromium } = require('playwright-core');

const BASE_URL = process.env.BASE_URL;
if (!BASE_URL) {
  throw new Error('BASE_URL is not set: run these with `npm run test:browser -w @scarpline/web`.');
}
const ORIGIN = new URL(BASE_URL).origin;
const SHOTS = path.join(__dirname, 'screenshots');
const LAPTOP = { width: 1366, height: 900 };
const NARROW = { width: 400, height: 800 };

/** The demo users the API seeds (apps/api/src/seed.ts). */
const USERS = {
  admin: { email: 'admin@wendlecombe.example', password: 'demo-admin-2931', name: 'Ada Admin' },
  engineer: {
    email: 'engineer@wendlecombe.example',
    password: 'demo-engineer-4417',
    name: 'Evan Engineer',
  },
  reviewer: {
    email: 'reviewer@wendlecombe.example',
    password: 'demo-reviewer-8062',
    name: 'Rhea Reviewer',
  },
  viewer: { email: 'viewer@wendlecombe.example', password: 'demo-viewer-5380', name: 'Vic Viewer' },
};

/**
 * Debian's chromium, headless. Playwright gives every launch a new, empty user-data folder of
 * its own (removed when the browser closes), and each scenario a new context on top of it.
 */
function launch() {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/**
 * A new context and page (no session: sessionStorage is empty). Records every request to
 * another host, every console error and every uncaught error of the page. A test that expects
 * the API to refuse something says so with allowStatus(401) (Chromium logs each 4xx answer as
 * a console error: "Failed to load resource: … status of 401").
 */
async function openPage(browser, viewport = LAPTOP) {
  const context = await browser.newContext({ viewport, baseURL: BASE_URL });
  // Nothing leaves the machine: a request to any other host is refused before it is sent.
  await context.route(
    (url) => url.origin !== ORIGIN,
    (route) => route.abort('blockedbyclient'),
  );
  const page = await context.newPage();
  page.setDefaultTimeout(15_000);
  const problems = [];
  const allowed = new Set();
  page.on('request', (req) => {
    const url = new URL(req.url());
    if (url.protocol === 'data:' || url.protocol === 'blob:') return;
    if (url.origin !== ORIGIN)
      problems.push(`request to another host: ${req.method()} ${req.url()}`);
  });
  page.on('console', (msg) => {
    if (msg.type() !== 'error') return;
    const status = /status of (\d{3})/.exec(msg.text());
    if (status && allowed.has(Number(status[1]))) return;
    problems.push(`console error: ${msg.text()} (${msg.location().url || 'no location'})`);
  });
  page.on('pageerror', (err) => problems.push(`uncaught error in the page: ${err.message}`));
  return {
    context,
    page,
    problems,
    allowStatus: (...codes) => codes.forEach((c) => allowed.add(c)),
  };
}

function slug(text) {
  return text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 60);
}

const AXE_SOURCE = fs.readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/**
 * Waits until the page's finite CSS transitions and animations have ended (a row that expands, a
 * label that floats, a message that fades in): axe measures colours as they are drawn, and a
 * text half-way through a fade has no contrast to speak of. Endless animations (a spinner) are
 * left running; 2 s at most.
 */
async function settled(page) {
  await page.evaluate(() => {
    // eslint-disable-next-line no-undef
    const finite = document
      .getAnimations()
      .filter((a) => Number.isFinite(a.effect?.getComputedTiming().endTime ?? Infinity));
    const done = Promise.all(finite.map((a) => a.finished.catch(() => undefined)));
    return Promise.race([done, new Promise((r) => setTimeout(r, 2000))]);
  });
}

/**
 * axe-core's WCAG 2.x A and AA rules on the page as it is now; fails with each violation's rule,
 * the elements and axe's summary. Run through the DevTools protocol, so the page's own CSP
 * (script-src 'self') stays as it is.
 */
async function accessible(page, name) {
  await settled(page);
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    // eslint-disable-next-line no-undef
    const r = await window.axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] },
    });
    return r.violations.map((v) => ({
      rule: v.id,
      impact: v.impact,
      nodes: v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')}: ${n.failureSummary}`),
    }));
  });
  assert.deepEqual(violations, [], `accessibility of ${name}`);
}

/**
 * A screenshot of the whole page into e2e/screenshots/<name>.png, after the page passed the
 * accessibility rules.
 */
async function shot(page, name) {
  fs.mkdirSync(SHOTS, { recursive: true });
  // a long page on a busy machine can take longer than an action's 15 s
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true, timeout: 60_000 });
  await accessible(page, name);
}

/**
 * Runs one scenario in a fresh page; fails it when the page went to another host or logged an
 * error, and keeps a screenshot of the page when it fails.
 */
async function scenario(browser, name, body, { viewport = LAPTOP, shotOnFailure = true } = {}) {
  const s = await openPage(browser, viewport);
  try {
    await body(s);
    assert.deepEqual(s.problems, [], 'the page requested another host or logged an error');
  } catch (e) {
    if (shotOnFailure) await shot(s.page, `failed-${slug(name)}`).catch(() => undefined);
    throw e;
  } finally {
    await s.context.close();
  }
}

/** Signs in through the sign-in page like a user: e-mail, password, the button. */
async function signIn(page, who, { alreadyThere = false } = {}) {
  const user = typeof who === 'string' ? USERS[who] : who;
  if (!alreadyThere) await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.getByTestId('role').waitFor();
}

/** The bearer token of the page's session (to ask the API what the page should show). */
function tokenOf(page) {
  return page.evaluate("JSON.parse(sessionStorage.getItem('scarpline.session')).token");
}

/** A request to the API with a bearer token; the parsed JSON, or the Response when not JSON. */
async function api(token, urlPath, init = {}) {
  const res = await fetch(`${BASE_URL}/api/v1${urlPath}`, {
    ...init,
    headers: { authorization: `Bearer ${token}`, ...(init.headers ?? {}) },
  });
  const type = res.headers.get('content-type') ?? '';
  return { status: res.status, body: type.includes('json') ? await res.json() : await res.text() };
}

/** Polls until fn() returns a truthy value (then returns it) or the time is up. */
async function eventually(fn, { timeout = 15_000, interval = 250, what = 'the condition' } = {}) {
  const end = Date.now() + timeout;
  let last;
  for (;;) {
    last = await fn();
    if (last) return last;
    if (Date.now() > end)
      throw new Error(`timed out after ${timeout / 1000} s waiting for ${what}`);
    await new Promise((r) => setTimeout(r, interval));
  }
}

/**
 * Submits a corridor (JSON text) to the demo project as the page's signed-in user, opens its
 * batch page and waits until it says done (`timeout` ms); resolves with the token and the
 * batch's id.
 */
async function submitToDemo(page, body, timeout) {
  const token = await tokenOf(page);
  const projects = await api(token, '/projects');
  assert.equal(projects.status, 200);
  const list = Array.isArray(projects.body) ? projects.body : projects.body.items;
  const project = list.find((p) => /Wendlecombe/.test(p.name));
  assert.ok(project, 'the demo project');
  const submitted = await api(token, `/projects/${project.id}/batches`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body,
  });
  assert.equal(submitted.status, 201, JSON.stringify(submitted.body));
  const batchId = submitted.body.id;
  await page.goto(`/batches/${batchId}`);
  const status = page.getByTestId('batch-status');
  await eventually(async () => /\bdone\b/i.test(await status.innerText()), {
    timeout,
    interval: 500,
    what: 'the batch status to say done',
  });
  return { token, batchId };
}

module.exports = {
  BASE_URL,
  LAPTOP,
  NARROW,
  USERS,
  accessible,
  api,
  eventually,
  launch,
  scenario,
  shot,
  signIn,
  submitToDemo,
  tokenOf,
};
