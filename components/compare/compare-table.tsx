import { Fragment } from 'react';
import { ScrollView, StyleSheet, Text, View } from 'react-native';

import type { ProfileAnalysis } from '@/calc/analysis';
import { colors, fonts, seriesColors, space, type as typeScale } from '@/constants/theme';
import { cellText, compareRows, delta, type Trend } from '@/lib/compare-rows';

const trendMark: Record<Trend, string> = { up: '▲', down: '▼', same: '' };

/** Values for each profile side by side; every column after the first shows its change from the first. */
export function CompareTable({ analyses, names }: { analyses: readonly ProfileAnalysis[]; names: readonly string[] }) {
  const base = analyses[0];
  let lastGroup = '';
  return (
    <ScrollView horizontal contentContainerStyle={styles.scroller} tabIndex={0} aria-label="Differences table, scrolls sideways" testID="compare-table">
      <View role="table" aria-label="Differences between profiles" style={styles.table}>
        <View role="row" style={[styles.row, styles.head]}>
          <Text role="columnheader" style={[styles.labelCell, styles.headText]}>
            Value
          </Text>
          {names.map((name, i) => (
            <Text key={name + i} role="columnheader" style={[styles.cell, styles.headText, { color: seriesColors[i] ?? colors.ink }]}>
              {name}
            </Text>
          ))}
        </View>
        {base
          ? compareRows.map((row) => {
              const showGroup = row.group !== lastGroup;
              lastGroup = row.group;
              const baseValue = row.value(base);
              return (
                <Fragment key={row.key}>
                  {showGroup ? (
                    <View role="row" style={styles.groupRow}>
                      <Text role="rowheader" style={styles.groupText}>
                        {row.group}
                      </Text>
                    </View>
                  ) : null}
                  <View role="row" style={styles.row} testID={`row-${row.key}`}>
                    <Text role="rowheader" style={styles.labelCell}>
                      {row.label} <Text style={styles.unit}>{row.unit}</Text>
                    </Text>
                    {analyses.map((a, i) => {
                      const value = row.value(a);
                      const d = i === 0 ? null : delta(baseValue, value, row.digits);
                      return (
                        <View key={i} role="cell" style={styles.cell} testID={`cell-${row.key}-${i}`}>
                          <Text style={styles.value}>{cellText(row, a)}</Text>
                          {d ? (
                            <Text
                              style={[styles.delta, d.trend === 'same' ? styles.same : styles.changed]}
                              aria-label={d.trend === 'same' ? 'same as first' : `${d.text} ${d.trend === 'up' ? 'more' : 'less'} than first`}
                              testID={`delta-${row.key}-${i}`}
                            >
                              {d.text} {trendMark[d.trend]}
                            </Text>
                          ) : null}
                        </View>
                      );
                    })}
                  </View>
                </Fragment>
              );
            })
          : null}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroller: { minWidth: '100%' },
  table: { minWidth: '100%' },
  row: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.grid, paddingVertical: space.xs, alignItems: 'center' },
  head: { borderBottomWidth: 2, borderBottomColor: colors.lineStrong },
  headText: { fontFamily: fonts.semibold, fontSize: 14, color: colors.ink },
  groupRow: { paddingTop: space.md, paddingBottom: space.xs },
  groupText: { ...typeScale.label, color: colors.accent, textTransform: 'uppercase', letterSpacing: 0.8 },
  labelCell: { width: 170, paddingRight: space.sm, ...typeScale.small, color: colors.ink, fontFamily: fonts.medium },
  unit: { color: colors.inkMuted, fontFamily: fonts.regular },
  cell: { width: 118, paddingHorizontal: space.xs },
  value: { ...typeScale.number, color: colors.ink },
  delta: { fontFamily: fonts.mono, fontSize: 12 },
  changed: { color: colors.ink, fontFamily: fonts.monoBold },
  same: { color: colors.inkMuted },
});
