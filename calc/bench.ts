/**
 * Calc benchmark: full analyses per second on one thread.
 *
 * Each analysis: valve events at both checking heights; intake, exhaust and
 * piston curves over the whole cycle at 0.5° steps with velocity and
 * acceleration; piston-to-valve sweeps for both valves; static and dynamic
 * compression; spring, retainer and preload checks; and on both lobes the
 * regrind envelope against the core, pressure angle and radius of curvature
 * (a whole cam turn at 1°), with the cleanup and lifter side of the cut. Inputs cycle through 64
 * varied profiles and engines so no result can be reused between calls.
 *
 * The budget is judged on CPU time used by this process (one JavaScript
 * thread; GC helper threads only add to it), so other work on a shared
 * machine does not decide the result. Wall-clock throughput is printed too.
 *
 * Run: npm run bench. Exits 1 when under budget.
 */
import { analyzeProfile, createAnalysisWorkspace, type AnalysisInput } from './analysis';
import { DEMO_FEASIBILITY_INPUT } from './demo';

const BUDGET = 20000;
const WARMUP_MS = 800;
const MEASURE_MS = 3000;

function variants(count: number): AnalysisInput[] {
  const base = DEMO_FEASIBILITY_INPUT;
  const out: AnalysisInput[] = [];
  for (let i = 0; i < count; i++) {
    const f = i / count;
    out.push({
      ...base,
      engine: {
        ...base.engine,
        stroke: 3.4 + 0.4 * f,
        rodLength: 5.7 + (0.6 * ((i * 7) % count)) / count,
        chamberCc: 62 + (i % 9),
        rockerRatioIntake: 1.5 + 0.1 * (i % 3),
      },
      profile: {
        ...base.profile,
        icl: 104 + (i % 9),
        lsa: 108 + (i % 7),
        intake: { ...base.profile.intake, duration050: 200 + (i % 24), advertisedDuration: 256 + (i % 24), lobeLift: 0.3 + 0.002 * (i % 20) },
        exhaust: { ...base.profile.exhaust, duration050: 206 + (i % 24), advertisedDuration: 264 + (i % 24), lobeLift: 0.31 + 0.002 * (i % 20) },
      },
    });
  }
  return out;
}

function run(inputs: AnalysisInput[], ms: number): { count: number; wallSeconds: number; cpuSeconds: number; sink: number } {
  const ws = createAnalysisWorkspace();
  let sink = 0;
  let count = 0;
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  let now = t0;
  while (now - t0 < ms) {
    for (let k = 0; k < inputs.length; k++) {
      const input = inputs[k];
      if (!input) continue;
      const a = analyzeProfile(input, { workspace: ws });
      sink +=
        (a.ptv.intake?.minClearance ?? 0) +
        a.compression.dynamic.ratio +
        (a.intake.curve.velocity[900] ?? 0) +
        (a.piston.acceleration[100] ?? 0) +
        (a.feasibility.exhaust.envelope?.minMargin ?? Number.NaN) +
        (a.feasibility.intake.pressureAngle?.rise.value ?? Number.NaN) +
        (a.feasibility.exhaust.curvature?.minSurface.value ?? Number.NaN);
      count++;
    }
    now = performance.now();
  }
  const cpu = process.cpuUsage(cpu0);
  return { count, wallSeconds: (now - t0) / 1000, cpuSeconds: (cpu.user + cpu.system) / 1e6, sink };
}

const inputs = variants(64);
run(inputs, WARMUP_MS);
const r = run(inputs, MEASURE_MS);
const perCpuSecond = Math.round(r.count / r.cpuSeconds);
const perWallSecond = Math.round(r.count / r.wallSeconds);
const sample = analyzeProfile(DEMO_FEASIBILITY_INPUT);
const points = sample.intake.curve.count * 3 + sample.exhaust.curve.count * 3 + sample.piston.count * 3;

console.log(`calc analyses/s: ${perCpuSecond} (budget ${BUDGET}) per CPU-second on one thread`);
console.log(`calc analyses/s wall clock: ${perWallSecond} over ${r.wallSeconds.toFixed(1)} s (${r.count} analyses, ${points} curve values each)`);
if (!Number.isFinite(r.sink)) console.log('unexpected non-finite result');
if (perCpuSecond < BUDGET || !Number.isFinite(r.sink)) {
  console.error(`calc bench: UNDER BUDGET (${perCpuSecond} < ${BUDGET})`);
  process.exit(1);
}
