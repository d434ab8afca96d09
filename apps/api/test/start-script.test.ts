/** `npm start` builds the web app only when its build is missing or older than its sources. */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { webBuildPlan } = require('../scripts/start.js') as {
  webBuildPlan: (webDir: string, dist: string) => { build: boolean; message: string };
};

let tmp: string;
let web: string;
let dist: string;

/** Sets a file's modification time to `t` seconds since the epoch, making it first if needed. */
function touch(file: string, t: number): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  if (!fs.existsSync(file)) fs.writeFileSync(file, '');
  fs.utimesSync(file, t, t);
}

beforeEach(() => {
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-start-'));
  web = path.join(tmp, 'apps/web');
  dist = path.join(web, 'dist/browser');
  fs.mkdirSync(web, { recursive: true });
  const pkg = { name: '@scarpline/web', scripts: { build: 'ng build' } };
  fs.writeFileSync(path.join(web, 'package.json'), JSON.stringify(pkg));
  touch(path.join(web, 'package.json'), 1000);
  touch(path.join(web, 'angular.json'), 1000);
  touch(path.join(web, 'src/app/app.ts'), 1000);
});

afterEach(() => fs.rmSync(tmp, { recursive: true, force: true }));

test('no build yet: build it', () => {
  expect(webBuildPlan(web, dist)).toEqual({
    build: true,
    message: `web: no build in ${dist}; building the web app`,
  });
});

test('a build newer than every source is up to date', () => {
  touch(path.join(dist, 'index.html'), 2000);
  expect(webBuildPlan(web, dist)).toEqual({
    build: false,
    message: `web: the build in ${dist} is up to date`,
  });
});

test.each([['src/app/sections/view.ts'], ['angular.json'], ['package.json'], ['public/logo.svg']])(
  'a build older than %s is rebuilt',
  (file) => {
    touch(path.join(dist, 'index.html'), 2000);
    touch(path.join(web, file), 3000);
    expect(webBuildPlan(web, dist)).toEqual({
      build: true,
      message: 'web: sources changed since the last build; building the web app',
    });
  },
);

test('files under node_modules, dist and .angular do not count as sources', () => {
  touch(path.join(dist, 'index.html'), 2000);
  touch(path.join(web, 'src/node_modules/x.js'), 3000);
  touch(path.join(web, 'dist/browser/main-AAAAAAAA.js'), 3000);
  touch(path.join(web, 'src/.angular/cache/y'), 3000);
  expect(webBuildPlan(web, dist).build).toBe(false);
});

test('without a build script it says so and does not build', () => {
  fs.writeFileSync(path.join(web, 'package.json'), JSON.stringify({ name: '@scarpline/web' }));
  expect(webBuildPlan(web, dist)).toEqual({
    build: false,
    message:
      'web: @scarpline/web has no "build" script yet; not building the web app (a placeholder page is served at /)',
  });
  touch(path.join(dist, 'index.html'), 500);
  expect(webBuildPlan(web, dist).message).toMatch(/\(serving the older build\)$/);
});

test('without a web workspace at all it does not build', () => {
  fs.rmSync(path.join(web, 'package.json'));
  expect(webBuildPlan(web, dist)).toEqual({
    build: false,
    message: `web: no ${web}/package.json; not building the web app`,
  });
});
