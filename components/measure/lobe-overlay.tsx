import { useMemo, useState } from 'react';
import { StyleSheet, Text, View, type LayoutChangeEvent } from 'react-native';
import Svg, { G, Line, Path, Text as SvgText } from 'react-native-svg';

import type { LobeSpec } from '@/calc/lift-curve';
import { colors, fonts, space, type as typeScale } from '@/constants/theme';

import { buildOverlayPaths } from '@/lib/lobe-overlay-paths';
import { niceTicks } from '@/lib/lift-plot-paths';

type LobeOverlayProps = {
  lobeId: string;
  points: readonly { angle: number; lift: number }[];
  centerline: number;
  /** The sheet's lobe for this valve, or null when no sheet is chosen. */
  spec: LobeSpec | null;
  specName: string | null;
  height?: number;
  testID?: string;
};

const padding = { top: 14, right: 12, bottom: 34, left: 52 };

/** One measured lobe (solid) over the sheet's lobe drawn at the same centreline (dashed), tappet lift against crank angle. */
export function LobeOverlay({ lobeId, points, centerline, spec, specName, height = 240, testID }: LobeOverlayProps) {
  const [width, setWidth] = useState(0);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.round(e.nativeEvent.layout.width));
  const paths = useMemo(() => {
    if (width <= 0) return null;
    try {
      return buildOverlayPaths(points, centerline, spec, { width, height, padding });
    } catch {
      return buildOverlayPaths(points, centerline, null, { width, height, padding });
    }
  }, [points, centerline, spec, width, height]);
  const description = `Measured tappet lift of lobe ${lobeId} against crank angle${spec ? `, over the ${specName ?? 'sheet'} lobe at the same centreline` : ''}.`;

  return (
    <View style={styles.box} onLayout={onLayout} testID={testID}>
      {paths ? (
        <Svg width={width} height={height} role="img" aria-label={description}>
          {niceTicks(0, paths.yMax, 4).map((v) => (
            <G key={`y${v}`}>
              <Line x1={padding.left} x2={width - padding.right} y1={paths.y(v)} y2={paths.y(v)} stroke={colors.grid} strokeWidth={1} />
              <SvgText x={padding.left - 6} y={paths.y(v) + 4} fontSize={11} fontFamily={fonts.mono} fill={colors.inkMuted} textAnchor="end">
                {v.toFixed(v === 0 ? 0 : 2)}
              </SvgText>
            </G>
          ))}
          {niceTicks(paths.from, paths.to, 5).map((d) => (
            <G key={`x${d}`}>
              <Line x1={paths.x(d)} x2={paths.x(d)} y1={padding.top} y2={height - padding.bottom} stroke={colors.grid} strokeWidth={1} />
              <SvgText x={paths.x(d)} y={height - padding.bottom + 16} fontSize={11} fontFamily={fonts.mono} fill={colors.ink} textAnchor="middle">
                {`${Math.round(d)}°`}
              </SvgText>
            </G>
          ))}
          <Line
            x1={paths.x(centerline)}
            x2={paths.x(centerline)}
            y1={padding.top}
            y2={height - padding.bottom}
            stroke={colors.lineStrong}
            strokeWidth={1}
            strokeDasharray="2 3"
          />
          {paths.spec ? <Path d={paths.spec} stroke={colors.inkMuted} strokeWidth={2} strokeDasharray="6 4" fill="none" /> : null}
          <Path d={paths.measured} stroke={lobeId.endsWith('I') ? colors.intake : colors.exhaust} strokeWidth={2.5} fill="none" />
        </Svg>
      ) : (
        <View style={{ height }} />
      )}
      <View style={styles.legend}>
        <View style={styles.legendItem}>
          <View style={[styles.swatch, { backgroundColor: lobeId.endsWith('I') ? colors.intake : colors.exhaust }]} />
          <Text style={styles.legendText}>Measured {lobeId}</Text>
        </View>
        {spec ? (
          <View style={styles.legendItem}>
            <View style={[styles.swatch, styles.dashed]} />
            <Text style={styles.legendText}>{specName ?? 'Sheet'} lobe, same centreline</Text>
          </View>
        ) : (
          <Text style={styles.axis}>Choose a spec sheet to draw its lobe underneath.</Text>
        )}
        <Text style={styles.axis}>Tappet lift (in) · crank degrees in the table&apos;s own frame</Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { width: '100%', gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center' },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs, flexShrink: 1 },
  swatch: { width: 18, height: 4, borderRadius: 2 },
  dashed: { backgroundColor: colors.inkMuted },
  legendText: { ...typeScale.small, color: colors.ink, fontFamily: fonts.medium, flexShrink: 1 },
  axis: { ...typeScale.small, color: colors.inkMuted },
});
