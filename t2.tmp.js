const core = require('@scarpline/core'); const fs = require('fs');
const f = process.argv[2];
const s0 = core.parseSections(fs.readFileSync(f, 'utf8'), f).sections[0];
const s = core.caseSection(s0, s0.cases ? s0.cases[0] : undefined);
for (const [label, x] of [['bare', { ...s, reinforcement: [], analysis: { ...s.analysis, requiredReinforcement: null } }], ['with', { ...s, analysis: { ...s.analysis, requiredReinforcement: null } }]]) {
  const ts = []; let r;
  for (let i = 0; i < 5; i++) { const a = process.hrtime.bigint(); r = core.analyzeSection(x); ts.push(Number(process.hrtime.bigint() - a) / 1e6); }
  ts.sort((a, b) => a - b);
  const c = r.cases[0];
  console.log(label, ts[2].toFixed(1), 'ms, trials', c.search.trials, 'fs', c.governing.fs.toFixed(3));
}
