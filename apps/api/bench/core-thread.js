// A thread of the API benchmark's core reference (batch-300.js): analyses each chunk of sections
// it is sent with the built core and answers with their governing FS (an empty chunk: it is ready).
const { parentPort } = require('node:worker_threads');
const { analyzeSection } = require('@scarpline/core');

parentPort.on('message', (sections) => {
  parentPort.postMessage(sections.map((s) => analyzeSection(s).governing?.fs ?? null));
});
