/**
 * A worker thread's script when the API runs from its TypeScript sources (under Jest, which
 * compiles them with ts-jest): TypeScript modules are compiled as they load (transpileModule:
 * the types are checked by ts-jest and tsc, not here), `@scarpline/core` and its subpaths load
 * the core's sources as Jest's map has it (packages/core/jest-map.js), and the module named by
 * `workerData.source` is what the thread runs. The built API never uses this file: its threads
 * run the compiled JavaScript.
 */
const fs = require('node:fs');
const Module = require('node:module');
const path = require('node:path');
const { workerData } = require('node:worker_threads');
const ts = require('typescript');
const { coreModuleNameMapper } = require('../../../packages/core/jest-map');

const CORE = path.resolve(__dirname, '../../../packages/core');
const map = Object.entries(coreModuleNameMapper(CORE)).map(([re, to]) => [new RegExp(re), to]);

const resolve = Module._resolveFilename;
Module._resolveFilename = function (request, ...rest) {
  for (const [re, to] of map) {
    if (re.test(request)) return request.replace(re, to);
  }
  return resolve.call(this, request, ...rest);
};

const OPTIONS = {
  module: ts.ModuleKind.CommonJS,
  target: ts.ScriptTarget.ES2022,
  esModuleInterop: true,
  resolveJsonModule: true,
  sourceMap: false,
};
require.extensions['.ts'] = (module, filename) => {
  const source = fs.readFileSync(filename, 'utf8');
  const { outputText } = ts.transpileModule(source, {
    compilerOptions: OPTIONS,
    fileName: filename,
  });
  module._compile(outputText, filename);
};

require(workerData.source);
