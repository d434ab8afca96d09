/**
 * Jest's map of `@scarpline/core` and each of its subpaths (package.json `exports`) to the
 * entry module's source, so that tests run the sources without a build: `.` is src/index.ts,
 * `./<name>` is src/<name>.ts. A subpath not in `exports` stays unresolved, as under Node.
 */
const { exports: entries } = require('./package.json');

/** `coreDir`: the core's folder as Jest names it (e.g. '<rootDir>/packages/core'). */
function coreModuleNameMapper(coreDir) {
  const names = Object.keys(entries)
    .filter((k) => k !== '.' && k !== './package.json')
    .map((k) => k.slice(2));
  return {
    '^@scarpline/core$': `${coreDir}/src/index.ts`,
    [`^@scarpline/core/(${names.join('|')})$`]: `${coreDir}/src/$1.ts`,
  };
}

module.exports = { coreModuleNameMapper };
