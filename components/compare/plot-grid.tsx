import { G, Line, Text as SvgText } from 'react-native-svg';

import { colors, fonts } from '@/constants/theme';

export type PlotPadding = { top: number; right: number; bottom: number; left: number };

type PlotGridProps = {
  width: number;
  height: number;
  padding: PlotPadding;
  /** Value → pixel on each axis. */
  x: (deg: number) => number;
  y: (value: number) => number;
  yTicks: readonly number[];
  yLabel: (value: number) => string;
  xTicks: readonly number[];
  xLabel: (deg: number) => string;
  /** A tick line drawn darker (and how wide), such as TDC or the nose. */
  xStrong: (deg: number) => { strong: boolean; width?: number };
  /** The line under the x labels saying which way the angle runs. */
  caption: string;
};

/** The grid, tick labels and axis caption every angle plot shares; the plot draws its own curves over it. */
export function PlotGrid({ width, height, padding, x, y, yTicks, yLabel, xTicks, xLabel, xStrong, caption }: PlotGridProps) {
  return (
    <>
      {yTicks.map((v) => (
        <G key={`y${v}`}>
          <Line x1={padding.left} x2={width - padding.right} y1={y(v)} y2={y(v)} stroke={colors.grid} strokeWidth={1} />
          <SvgText x={padding.left - 6} y={y(v) + 4} fontSize={11} fontFamily={fonts.mono} fill={colors.inkMuted} textAnchor="end">
            {yLabel(v)}
          </SvgText>
        </G>
      ))}
      {xTicks.map((deg) => {
        const { strong, width: strokeWidth = 1 } = xStrong(deg);
        return (
          <G key={`x${deg}`}>
            <Line
              x1={x(deg)}
              x2={x(deg)}
              y1={padding.top}
              y2={height - padding.bottom}
              stroke={strong ? colors.lineStrong : colors.grid}
              strokeWidth={strokeWidth}
            />
            <SvgText x={x(deg)} y={height - padding.bottom + 16} fontSize={11} fontFamily={fonts.medium} fill={colors.ink} textAnchor="middle">
              {xLabel(deg)}
            </SvgText>
          </G>
        );
      })}
      <SvgText x={padding.left} y={height - 4} fontSize={11} fontFamily={fonts.regular} fill={colors.inkMuted}>
        {caption}
      </SvgText>
    </>
  );
}
