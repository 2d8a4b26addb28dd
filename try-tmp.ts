import { analyzeProfile, createAnalysisWorkspace } from './calc/analysis';
import { DEMO_ANALYSIS_INPUT } from './calc/demo';
const ws = createAnalysisWorkspace();
let n = 0; const t0 = performance.now();
while (performance.now() - t0 < 4000) { analyzeProfile(DEMO_ANALYSIS_INPUT, { workspace: ws }); n++; }
console.log((n / ((performance.now() - t0) / 1000)).toFixed(0), '/s');
