// Preloaded by startup.js (`node -r`): when the process exits, writes the files it loaded
// (require's cache), one a line, to the file named by SCARPLINE_LOADED_MODULES.
'use strict';

const { writeFileSync } = require('node:fs');

const target = process.env.SCARPLINE_LOADED_MODULES;
if (target) {
  process.on('exit', () => writeFileSync(target, Object.keys(require.cache).join('\n')));
}
