import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import Svg, { Circle, Line, Path } from 'react-native-svg';

import { PlotGrid } from '@/components/compare/plot-grid';
import { colors, space, type as typeScale } from '@/constants/theme';
import { niceTicks } from '@/lib/lift-plot-paths';
import { buildMarginPaths, MARGIN_WINDOW } from '@/lib/margin-plot-paths';
import type { FeasibilityResults } from '@/shared/sheets';

const padding = { top: 14, right: 12, bottom: 34, left: 58 };
const xTicks = [-120, -90, -60, -30, 0, 30, 60, 90, 120];

/** Metal between the old lobe and the new one against cam angle from the nose, intake and exhaust, tightest points marked. */
export function MarginPlot({ feasibility, height = 220, testID }: { feasibility: FeasibilityResults; height?: number; testID?: string }) {
  const [width, setWidth] = useState(0);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.round(e.nativeEvent.layout.width));
  const paths = useMemo(() => (width > 0 ? buildMarginPaths(feasibility, { width, height, padding }) : null), [feasibility, width, height]);
  const stock = feasibility.limits.finishingStock.min;
  const description = `Metal left between the old lobe and the new one, inches, against cam degrees from the nose (${MARGIN_WINDOW.from} to ${MARGIN_WINDOW.to}). Intake solid, exhaust dashed; the dotted line is the ${stock.toFixed(3)} in finishing stock; below zero the new lobe stands outside the old one.`;
  return (
    <View style={styles.box} onLayout={onLayout} testID={testID}>
      {paths ? (
        <Svg width={width} height={height} role="img" aria-label={description}>
          <PlotGrid
            width={width}
            height={height}
            padding={padding}
            x={paths.x}
            y={paths.y}
            yTicks={niceTicks(paths.yMin, paths.yMax, 4)}
            yLabel={(v) => v.toFixed(3)}
            xTicks={xTicks}
            xLabel={(deg) => (deg === 0 ? 'nose' : `${deg}°`)}
            xStrong={(deg) => ({ strong: deg === 0 })}
            caption="← opening flank · cam degrees · closing flank →"
          />
          <Line x1={padding.left} x2={width - padding.right} y1={paths.y(0)} y2={paths.y(0)} stroke={colors.fail} strokeWidth={1.5} />
          <Line
            x1={padding.left}
            x2={width - padding.right}
            y1={paths.y(stock)}
            y2={paths.y(stock)}
            stroke={colors.watch}
            strokeWidth={1.5}
            strokeDasharray="2 3"
          />
          {paths.exhaust ? <Path d={paths.exhaust} stroke={colors.exhaust} strokeWidth={2} strokeDasharray="6 4" fill="none" /> : null}
          {paths.intake ? <Path d={paths.intake} stroke={colors.intake} strokeWidth={2.25} fill="none" /> : null}
          {paths.marks.map((m) => (
            <Circle
              key={m.lobe}
              cx={m.px}
              cy={m.py}
              r={5}
              fill={colors.surface}
              stroke={m.lobe === 'intake' ? colors.intake : colors.exhaust}
              strokeWidth={2.5}
            />
          ))}
        </Svg>
      ) : (
        <View style={{ height }} />
      )}
      <Text style={styles.legend}>
        Metal left (in, on the radius) · solid intake · dashed exhaust · dotted: finishing stock · red: the old lobe’s surface · circles: tightest points
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { width: '100%', gap: space.xs },
  legend: { ...typeScale.small, color: colors.inkMuted },
});
