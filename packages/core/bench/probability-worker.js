// A benchmark worker of the probabilistic analysis: realisations from..to of one case of a
// seeded run with the surface searched again in each; answers with their FS. The run is
// prepared once (the critical surface at the means comes with the first chunk).
const { parentPort } = require('node:worker_threads');
const { probabilityRun, realisationsFs } = require('../dist/index.js');

let run = null;
parentPort.on('message', (task) => {
  if (task === null) return parentPort.postMessage([]);
  if (!run) run = probabilityRun(task.section, task.spec, { criticals: task.criticals });
  parentPort.postMessage(realisationsFs(run, 0, task.from, task.to));
});
