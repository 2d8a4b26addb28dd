import { line } from 'd3-shape';

import type { FeasibilityResults } from '@/shared/sheets';

/** Cam degrees from the lobe centre shown on the margin plot: the whole event and some base circle. */
export const MARGIN_WINDOW = { from: -120, to: 120 } as const;

export type MarginFrame = { width: number; height: number; padding: { top: number; right: number; bottom: number; left: number } };

export type MarginPaths = {
  /** SVG path data per lobe (null when the lobe has no envelope). */
  intake: string | null;
  exhaust: string | null;
  /** y range, inches of margin on the radius. */
  yMin: number;
  yMax: number;
  x: (deg: number) => number;
  y: (inches: number) => number;
  /** The tightest point of each lobe, in pixels and in calc's numbers. */
  marks: { lobe: 'intake' | 'exhaust'; at: number; margin: number; px: number; py: number }[];
};

/**
 * The material margin of each lobe against cam angle from its centre, as SVG paths
 * (calc's envelope, sampled as calc gave it), with the finishing stock and zero inside
 * the y range and each lobe's tightest point placed for a mark. Pure.
 */
export function buildMarginPaths(f: FeasibilityResults, frame: MarginFrame): MarginPaths {
  const { width, height, padding } = frame;
  const { from, to } = MARGIN_WINDOW;
  let yMin = Math.min(0, f.limits.finishingStock.min);
  let yMax = Math.max(0, f.limits.finishingStock.min);
  const inWindow = (lobe: 'intake' | 'exhaust') => {
    const e = f[lobe].envelope;
    if (!e) return [];
    const pts: [number, number][] = [];
    e.margin.forEach((m, i) => {
      const deg = e.start + i * e.step;
      if (deg >= from && deg <= to) pts.push([deg, m]);
    });
    return pts;
  };
  const series = { intake: inWindow('intake'), exhaust: inWindow('exhaust') };
  for (const pts of [series.intake, series.exhaust]) {
    for (const [, m] of pts) {
      if (m < yMin) yMin = m;
      if (m > yMax) yMax = m;
    }
  }
  const headroom = (yMax - yMin) * 0.08 || 0.01;
  yMin -= headroom;
  yMax += headroom;
  const plotW = width - padding.left - padding.right;
  const plotH = height - padding.top - padding.bottom;
  const x = (deg: number) => padding.left + ((deg - from) / (to - from)) * plotW;
  const y = (v: number) => padding.top + (1 - (v - yMin) / (yMax - yMin)) * plotH;
  const path = (pts: [number, number][]) =>
    pts.length
      ? (line<[number, number]>()
          .x((p) => x(p[0]))
          .y((p) => y(p[1]))(pts) ?? null)
      : null;
  const marks = (['intake', 'exhaust'] as const).flatMap((lobe) => {
    const e = f[lobe].envelope;
    return e ? [{ lobe, at: e.minAt, margin: e.minMargin, px: x(Math.min(to, Math.max(from, e.minAt))), py: y(e.minMargin) }] : [];
  });
  return { intake: path(series.intake), exhaust: path(series.exhaust), yMin, yMax, x, y, marks };
}
