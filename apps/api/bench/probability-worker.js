// A benchmark worker: each chunk of sections it is sent analysed as a section job does (the
// deterministic analysis, then each case's probability of failure on its critical surface),
// answering with their P_f.
const { parentPort } = require('node:worker_threads');
const { analyzeSection, stationProbability } = require('@scarpline/core');

parentPort.on('message', (sections) => {
  parentPort.postMessage(
    sections.map((s) => {
      const deterministic = analyzeSection(s);
      return stationProbability(s, {}, deterministic)?.summary[0]?.pFailure.p ?? null;
    }),
  );
});
