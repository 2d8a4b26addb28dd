import { line } from 'd3-shape';

import type { ProfileAnalysis } from '@/calc/analysis';

/** What the plot's y axis shows. */
export type PlotMode = 'lift' | 'velocity' | 'acceleration';

export type PlotFrame = {
  width: number;
  height: number;
  /** Space for axis labels, px. */
  padding: { top: number; right: number; bottom: number; left: number };
  /** Crank-degree window, degrees ATDC overlap. */
  from: number;
  to: number;
};

export type PlotPaths = {
  /** One entry per analysis: SVG path data for intake and exhaust. */
  series: { intake: string; exhaust: string }[];
  /** y range in the plotted unit (inches, in/deg, in/deg²). */
  yMin: number;
  yMax: number;
  /** Pixel position of a crank angle and of a y value. */
  x: (deg: number) => number;
  y: (value: number) => number;
  /** Overlap of the first profile at the advertised heights, as a crank-degree span, or null without overlap. */
  overlap: { from: number; to: number } | null;
};

/** Crank degrees between plotted points (the curves are sampled every 0.5°). */
const PLOT_STEP = 1;

function channel(curve: ProfileAnalysis['intake']['curve'], mode: PlotMode) {
  return mode === 'lift' ? curve.lift : mode === 'velocity' ? curve.velocity : curve.acceleration;
}

/** Builds the SVG paths for overlaid intake and exhaust curves of up to three analyses. Pure and allocation-light. */
export function buildPlotPaths(analyses: readonly ProfileAnalysis[], mode: PlotMode, frame: PlotFrame): PlotPaths {
  const { width, height, padding, from, to } = frame;
  const first = analyses[0];
  let yMin = 0;
  let yMax = 0;
  const indexes: number[] = [];
  if (first) {
    const grid = first.intake.curve;
    const stride = Math.max(1, Math.round(PLOT_STEP / grid.step));
    const i0 = Math.max(0, Math.ceil((from - grid.start) / grid.step));
    const i1 = Math.min(grid.count - 1, Math.floor((to - grid.start) / grid.step));
    for (let i = i0; i <= i1; i += stride) indexes.push(i);
  }
  for (const a of analyses) {
    for (const curve of [a.intake.curve, a.exhaust.curve]) {
      const values = channel(curve, mode);
      for (const i of indexes) {
        const v = values[i] ?? 0;
        if (v > yMax) yMax = v;
        if (v < yMin) yMin = v;
      }
    }
  }
  if (yMax === yMin) yMax = yMin + 1;
  const headroom = (yMax - yMin) * 0.06;
  yMax += headroom;
  if (yMin < 0) yMin -= headroom;

  const plotW = width - padding.left - padding.right;
  const plotH = height - padding.top - padding.bottom;
  const x = (deg: number) => padding.left + ((deg - from) / (to - from)) * plotW;
  const y = (value: number) => padding.top + (1 - (value - yMin) / (yMax - yMin)) * plotH;

  const series = analyses.map((a) => {
    const grid = a.intake.curve;
    const path = (values: Float64Array) =>
      line<number>()
        .x((i) => x(grid.start + i * grid.step))
        .y((i) => y(values[i] ?? 0))(indexes) ?? '';
    return { intake: path(channel(a.intake.curve, mode)), exhaust: path(channel(a.exhaust.curve, mode)) };
  });

  const adv = first?.events.advertised;
  const overlap = adv && adv.ivoBtdc + adv.evcAtdc > 0 ? { from: -adv.ivoBtdc, to: adv.evcAtdc } : null;
  return { series, yMin, yMax, x, y, overlap };
}

/** Round tick values across [min, max]. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  const span = max - min;
  if (!(span > 0)) return [min];
  const raw = span / count;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * magnitude).find((s) => s >= raw) ?? raw;
  const ticks: number[] = [];
  for (let v = Math.ceil(min / step) * step; v <= max + step * 1e-9; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return ticks;
}
