#!/usr/bin/env node
// The `scarpline` command: the compiled CLI (npm run build writes dist/).
require('../dist/main.js');
