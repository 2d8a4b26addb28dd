import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import Svg, { G, Path, Rect } from 'react-native-svg';

import type { ProfileAnalysis } from '@/calc/analysis';
import { PlotGrid } from '@/components/compare/plot-grid';
import { colors, fonts, seriesColors, space, type as typeScale } from '@/constants/theme';

import { buildPlotPaths, niceTicks, type PlotMode } from '@/lib/lift-plot-paths';

type LiftPlotProps = {
  analyses: readonly ProfileAnalysis[];
  names: readonly string[];
  mode: PlotMode;
  height?: number;
  testID?: string;
};

const padding = { top: 16, right: 12, bottom: 36, left: 52 };
const crankWindow = { from: -270, to: 270 };
const xTicks = [-270, -180, -90, 0, 90, 180, 270];
const yUnit: Record<PlotMode, string> = { lift: 'in', velocity: 'in/°', acceleration: 'in/°²' };
const yTitle: Record<PlotMode, string> = { lift: 'Valve lift', velocity: 'Valve velocity', acceleration: 'Valve acceleration' };

function xLabel(deg: number) {
  if (deg === 0) return 'TDC';
  if (Math.abs(deg) === 180) return 'BDC';
  return `${Math.abs(deg)}°`;
}

function yLabel(value: number, mode: PlotMode) {
  return mode === 'lift' ? value.toFixed(value === 0 ? 0 : 2) : value.toExponential(0);
}

/** Overlaid intake (solid) and exhaust (dashed) curves against crank angle around overlap TDC, with overlap shaded. */
export function LiftPlot({ analyses, names, mode, height = 300, testID }: LiftPlotProps) {
  const [width, setWidth] = useState(0);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.round(e.nativeEvent.layout.width));
  const paths = useMemo(() => (width > 0 ? buildPlotPaths(analyses, mode, { width, height, padding, ...crankWindow }) : null), [analyses, mode, width, height]);
  const description = `${yTitle[mode]} against crank angle for ${names.join(', ')}. Intake solid, exhaust dashed. TDC is overlap top dead centre.`;

  return (
    <View style={styles.box} onLayout={onLayout} testID={testID}>
      {paths ? (
        <Svg width={width} height={height} role="img" aria-label={description}>
          {paths.overlap ? (
            <Rect
              x={paths.x(paths.overlap.from)}
              y={padding.top}
              width={Math.max(1, paths.x(paths.overlap.to) - paths.x(paths.overlap.from))}
              height={height - padding.top - padding.bottom}
              fill={colors.overlapShade}
            />
          ) : null}
          <PlotGrid
            width={width}
            height={height}
            padding={padding}
            x={paths.x}
            y={paths.y}
            yTicks={niceTicks(paths.yMin, paths.yMax, 4)}
            yLabel={(v) => yLabel(v, mode)}
            xTicks={xTicks}
            xLabel={xLabel}
            xStrong={(deg) => ({ strong: deg === 0 || Math.abs(deg) === 180, width: deg === 0 ? 1.5 : 1 })}
            caption="← exhaust stroke · crank degrees · intake stroke →"
          />
          {paths.series.map((s, i) => (
            <G key={names[i] ?? i}>
              <Path d={s.exhaust} stroke={seriesColors[i] ?? colors.ink} strokeWidth={2} strokeDasharray="6 4" fill="none" />
              <Path d={s.intake} stroke={seriesColors[i] ?? colors.ink} strokeWidth={2.25} fill="none" />
            </G>
          ))}
        </Svg>
      ) : (
        <View style={{ height }} />
      )}
      <View style={styles.legend}>
        <Text style={styles.axis}>
          {yTitle[mode]} ({yUnit[mode]})
        </Text>
        {names.map((name, i) => (
          <View key={name + i} style={styles.legendItem}>
            <View style={[styles.swatch, { backgroundColor: seriesColors[i] ?? colors.ink }]} />
            <Text style={styles.legendText}>{name}</Text>
          </View>
        ))}
        <Text style={styles.axis}>solid intake · dashed exhaust · shaded overlap</Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { width: '100%', gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center' },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: 18, height: 4, borderRadius: 2 },
  legendText: { ...typeScale.small, color: colors.ink, fontFamily: fonts.medium },
  axis: { ...typeScale.small, color: colors.inkMuted },
});
