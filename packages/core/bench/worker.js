// A benchmark worker: analyses each chunk of sections it is sent and answers with their governing FS.
const { parentPort } = require('node:worker_threads');
const { analyzeSection } = require('../dist/index.js');

parentPort.on('message', (sections) => {
  parentPort.postMessage(sections.map((s) => analyzeSection(s).governing?.fs ?? null));
});
