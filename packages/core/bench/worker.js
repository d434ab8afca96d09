// A benchmark worker: analyses each section it is sent and answers with the governing FS.
const { parentPort } = require('node:worker_threads');
const { analyzeSection } = require('../dist/index.js');

parentPort.on('message', (section) => {
  const r = analyzeSection(section);
  parentPort.postMessage(r.governing ? r.governing.fs : null);
});
