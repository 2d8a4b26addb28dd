import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, space, type as typeScale } from '@/constants/theme';
import { lifterTypeLabels } from '@/shared/engine';
import { EVENT_CONVENTION, eventAngle } from '@/lib/event-angle';
import { coreView } from '@/shared/fits-core';
import type { Revision } from '@/shared/sheets';

import { CheckList } from '@/components/sheet/check-list';

const f = (v: number, d: number) => v.toFixed(d).replace('-', '−');

function Row({ label, intake, exhaust, testID }: { label: string; intake: string; exhaust: string; testID?: string }) {
  return (
    <View role="row" style={styles.row} testID={testID}>
      <Text role="rowheader" style={styles.label}>
        {label}
      </Text>
      <Text role="cell" style={styles.cell}>
        {intake}
      </Text>
      <Text role="cell" style={styles.cell}>
        {exhaust}
      </Text>
    </View>
  );
}

/** A revision's lobe specs, engine snapshot and saved results, laid out for the grinder and the builder alike. */
export function RevisionView({ revision }: { revision: Revision }) {
  const { spec, engine, results } = revision;
  const i = spec.intake;
  const e = spec.exhaust;
  const ev = results.events050;
  const ea = results.eventsAdvertised;
  return (
    <View style={styles.stack} testID={`revision-${revision.number}`}>
      <View role="table" aria-label="Lobe specs" style={styles.table}>
        <View role="row" style={[styles.row, styles.head]}>
          <Text role="columnheader" style={[styles.label, styles.headText]}>
            Lobe
          </Text>
          <Text role="columnheader" style={[styles.cell, styles.headText]}>
            Intake
          </Text>
          <Text role="columnheader" style={[styles.cell, styles.headText]}>
            Exhaust
          </Text>
        </View>
        <Row label="Duration at 0.050 in (°)" intake={f(i.duration050, 1)} exhaust={f(e.duration050, 1)} testID="sheet-duration050" />
        <Row
          label="Advertised duration (°)"
          intake={`${f(i.advertisedDuration, 1)} @ ${f(i.advertisedHeight, 3)} in`}
          exhaust={`${f(e.advertisedDuration, 1)} @ ${f(e.advertisedHeight, 3)} in`}
        />
        <Row label="Lobe lift (in)" intake={f(i.lobeLift, 3)} exhaust={f(e.lobeLift, 3)} />
        <Row label="Valve lift (in)" intake={f(results.valveLift.intake, 3)} exhaust={f(results.valveLift.exhaust, 3)} />
        <Row label="Lash (in)" intake={f(i.lash, 3)} exhaust={f(e.lash, 3)} />
        <Row label="Rocker ratio" intake={f(engine.rockerRatioIntake, 2)} exhaust={f(engine.rockerRatioExhaust, 2)} />
        <Row label="Opens at 0.050 in" intake={eventAngle(ev.ivoBtdc, 'BTDC')} exhaust={eventAngle(ev.evoBbdc, 'BBDC')} />
        <Row label="Closes at 0.050 in" intake={eventAngle(ev.ivcAbdc, 'ABDC')} exhaust={eventAngle(ev.evcAtdc, 'ATDC')} />
        <Row label="Opens, advertised" intake={eventAngle(ea.ivoBtdc, 'BTDC')} exhaust={eventAngle(ea.evoBbdc, 'BBDC')} />
        <Row label="Closes, advertised" intake={eventAngle(ea.ivcAbdc, 'ABDC')} exhaust={eventAngle(ea.evcAtdc, 'ATDC')} />
        <Row label="Centreline" intake={eventAngle(spec.icl, 'ATDC')} exhaust={eventAngle(ev.ecl, 'BTDC')} />
      </View>
      <Text style={styles.convention} testID="sheet-event-convention">
        {EVENT_CONVENTION}
      </Text>
      <View style={styles.facts}>
        <Fact label="Lobe separation" value={`${f(spec.lsa, 1)}° cam`} />
        <Fact label="Advance" value={`${f(ev.advance, 1)}°`} />
        <Fact label="Overlap at 0.050 in" value={`${f(ev.overlap, 1)}°`} testID="sheet-overlap" />
        <Fact label="Base circle" value={spec.baseCircle === null ? 'not stated' : `${f(spec.baseCircle, 3)} in`} />
        <Fact label="Lifters" value={lifterTypeLabels[engine.lifterType]} />
        <Fact label="Cylinders" value={String(engine.cylinders)} />
        <Fact label="Firing order" value={engine.firingOrder || 'not stated'} />
        <Fact label="Static / dynamic CR" value={`${f(results.staticCompression, 2)} / ${f(results.dynamicCompression, 2)} :1`} />
      </View>
      <CoreFacts revision={revision} />
      <CheckList checks={results.checks} skipped={results.skipped} testID="sheet-checks" />
    </View>
  );
}

const coreResult = { pass: 'fits the core', watch: 'fits the core, close to a limit', fail: 'does not fit the core', 'not-run': 'not worked out' } as const;

/** What the grinder needs to confirm the core will do: the cut, the finishing stock and the margin result. */
function CoreFacts({ revision }: { revision: Revision }) {
  const feasibility = revision.results.feasibility;
  const view = coreView(feasibility);
  return (
    <View style={styles.facts} role="group" aria-label="The core" testID="sheet-core">
      <Fact label="Base-circle cut" value={feasibility?.cut == null ? 'not worked out' : `${f(feasibility.cut, 3)} in`} testID="sheet-core-cut" />
      <Fact label="Finishing stock" value={feasibility ? `${f(feasibility.limits.finishingStock.min, 3)} in` : 'not worked out'} testID="sheet-core-stock" />
      <Fact
        label="Tightest margin"
        value={view.tightest ? `${f(view.tightest.margin, 3)} in, ${view.tightest.lobe}` : 'not worked out'}
        testID="sheet-core-margin"
      />
      <Fact label="Result" value={coreResult[view.verdict]} testID="sheet-core-result" />
    </View>
  );
}

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <Text style={styles.factLabel}>{label}</Text>
      <Text style={styles.factValue}>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  convention: { ...typeScale.small, color: colors.inkMuted },
  stack: { gap: space.lg },
  table: { width: '100%' },
  row: { flexDirection: 'row', paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.grid, gap: space.sm },
  head: { borderBottomWidth: 2, borderBottomColor: colors.lineStrong },
  headText: { fontFamily: fonts.semibold, color: colors.ink },
  label: { flex: 3, ...typeScale.small, color: colors.ink, fontFamily: fonts.medium },
  cell: { flex: 2, ...typeScale.number, fontSize: 14, color: colors.ink },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  fact: { minWidth: 140, gap: 2 },
  factLabel: { ...typeScale.small, color: colors.inkMuted },
  factValue: { ...typeScale.number, color: colors.ink },
});
