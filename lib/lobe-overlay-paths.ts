import { line } from 'd3-shape';

import { synthesizeLiftCurve, type LobeSpec } from '@/calc/lift-curve';

export type OverlayFrame = { width: number; height: number; padding: { top: number; right: number; bottom: number; left: number } };

export type OverlayPaths = {
  measured: string;
  spec: string | null;
  from: number;
  to: number;
  yMax: number;
  x: (deg: number) => number;
  y: (lift: number) => number;
};

/**
 * SVG paths for one measured lobe (tappet lift against crank angle) and the
 * sheet's lobe synthesised at the same centreline, so the shapes line up and
 * wear shows as the gap between them. Pure.
 */
export function buildOverlayPaths(
  points: readonly { angle: number; lift: number }[],
  centerline: number,
  spec: LobeSpec | null,
  frame: OverlayFrame,
): OverlayPaths {
  const sorted = [...points].sort((a, b) => a.angle - b.angle);
  const from = sorted[0]?.angle ?? centerline - 180;
  const to = sorted[sorted.length - 1]?.angle ?? centerline + 180;
  let specPoints: { angle: number; lift: number }[] = [];
  if (spec) {
    const half = Math.ceil(Math.max(centerline - from, to - centerline)) + 1;
    const curve = synthesizeLiftCurve({ ...spec, centerline: 0, rockerRatio: 1, lash: 0, grid: { start: -half, step: 1, count: 2 * half + 1 } });
    specPoints = Array.from(curve.lift, (lift, i) => ({ angle: centerline - half + i, lift })).filter((p) => p.angle >= from && p.angle <= to);
  }
  const top = Math.max(0.001, ...sorted.map((p) => p.lift), ...specPoints.map((p) => p.lift)) * 1.08;
  const { width, height, padding } = frame;
  const x = (deg: number) => padding.left + ((deg - from) / Math.max(1e-9, to - from)) * (width - padding.left - padding.right);
  const y = (lift: number) => padding.top + (1 - lift / top) * (height - padding.top - padding.bottom);
  const path = (list: { angle: number; lift: number }[]) =>
    line<{ angle: number; lift: number }>()
      .x((p) => x(p.angle))
      .y((p) => y(p.lift))(list) ?? '';
  return { measured: path(sorted), spec: spec ? path(specPoints) : null, from, to, yMax: top, x, y };
}
