import { synthesizeLobe, sampleValveCurveRaw, createCurveBuffers, CYCLE_GRID } from './calc/lift-curve';
import { pistonCurve, analyzeProfile, createAnalysisWorkspace } from './calc/analysis';
import { DEMO_ANALYSIS_INPUT } from './calc/demo';
const shape = synthesizeLobe({duration050:212, advertisedDuration:270, advertisedHeight:0.006, lobeLift:0.333});
const buf = createCurveBuffers(1441);
function time(name: string, f: () => void) { let n=0; const t0=performance.now(); while (performance.now()-t0<1500){f();n++;} console.log(name, ((performance.now()-t0)*1000/n).toFixed(2),'µs'); }
time('sample', () => sampleValveCurveRaw(shape, 108, 1.6, 0, CYCLE_GRID, buf));
time('piston', () => pistonCurve({stroke:3.6, rodLength:6}));
time('synth', () => synthesizeLobe({duration050:212, advertisedDuration:270, advertisedHeight:0.006, lobeLift:0.333}));
const ws = createAnalysisWorkspace();
time('analysis', () => analyzeProfile(DEMO_ANALYSIS_INPUT, {workspace: ws}));
