import { Link } from 'expo-router';
import { Suspense, useMemo } from 'react';
import { ScrollView, StyleSheet, Text, View } from 'react-native';

import { LiftPlot, useCalc } from '@/components/ui/lazy-calc';
import { NoPrint } from '@/components/ui/no-print';
import { PrintButton } from '@/components/ui/print-button';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { RevisionNotes } from '@/components/sheet/revision-notes';
import { RevisionView } from '@/components/sheet/revision-view';
import { formatDate } from '@/constants/format';
import { colors, fonts, space, type as typeScale } from '@/constants/theme';
import { useOrderQuery } from '@/hooks/use-orders';
import { orderStageLabels, type OrderDetail } from '@/shared/orders';

/** Widest the sheet gets, in CSS px: fits inside Letter and A4 at 12 mm margins, so the plot prints at the width it was drawn. */
const sheetWidth = 680;

export function PrintScreen({ id }: { id: string }) {
  const order = useOrderQuery(id);
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID="print-screen">
      {order.isPending ? <Pending label="Preparing the sheet…" /> : null}
      {order.isError ? <ErrorNotice error={order.error} onRetry={() => order.refetch()} /> : null}
      {order.data ? (
        <Suspense fallback={<Pending label="Preparing the sheet…" />}>
          <PrintSheet order={order.data} />
        </Suspense>
      ) : null}
    </ScrollView>
  );
}

function PrintSheet({ order }: { order: OrderDetail }) {
  const r = order.revision;
  const { analyzeRecords } = useCalc();
  const analysis = useMemo(() => analyzeRecords(r.engine, r.spec), [analyzeRecords, r.engine, r.spec]);
  return (
    <View style={styles.sheet}>
      <NoPrint>
        <View style={styles.tools}>
          <Link href={{ pathname: '/orders/[id]', params: { id: order.id } }} style={styles.back} testID="print-back">
            ← Back to the order
          </Link>
          <PrintButton />
        </View>
      </NoPrint>
      <View style={styles.masthead}>
        <View style={styles.grow}>
          <Text style={styles.kicker}>Lobewright grind sheet</Text>
          <Text role="heading" aria-level={1} style={styles.title}>
            {order.sheetTitle}
          </Text>
          <Text style={styles.body}>{order.vehicle}</Text>
        </View>
        <View style={styles.stamp}>
          <Text style={styles.small}>Checksum</Text>
          <Text style={styles.checksum} testID="print-checksum">
            {order.checksum}
          </Text>
        </View>
      </View>
      <View style={styles.facts}>
        <Fact label="Revision" value={String(order.revisionNumber)} testID="print-revision" />
        <Fact label="Issued" value={formatDate(order.issuedAt)} testID="print-issued" />
        <Fact label="From (repair shop)" value={order.repairShop.name} />
        <Fact label="To (grinding shop)" value={order.grinderShop.name} />
        <Fact label="Stage when printed" value={orderStageLabels[order.stage]} />
      </View>
      <View style={styles.block}>
        <Text role="heading" aria-level={2} style={styles.heading}>
          Valve lift against crank angle
        </Text>
        <LiftPlot analyses={[analysis]} names={[r.label]} mode="lift" height={240} testID="print-plot" />
      </View>
      <View style={styles.block}>
        <Text role="heading" aria-level={2} style={styles.heading}>
          Lobes and engine
        </Text>
        <RevisionView revision={r} />
      </View>
      <View style={styles.block}>
        <Text role="heading" aria-level={2} style={styles.heading}>
          Core and base-circle notes
        </Text>
        <RevisionNotes revision={r} testPrefix="print" />
      </View>
      <Text style={styles.small}>
        Both shops confirm they hold the same revision when their checksums match. A revision never changes once issued; changes come as a new revision with a
        new checksum.
      </Text>
    </View>
  );
}

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <Text style={styles.small}>{label}</Text>
      <Text style={styles.factValue}>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.surface },
  content: { padding: space.lg, paddingBottom: space.xxxl },
  sheet: { width: '100%', maxWidth: sheetWidth, alignSelf: 'center', gap: space.lg },
  tools: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.md },
  back: { ...typeScale.label, color: colors.accent, textDecorationLine: 'underline', paddingVertical: space.xs },
  masthead: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg, paddingBottom: space.md, borderBottomWidth: 2, borderBottomColor: colors.ink },
  grow: { flexGrow: 1, flexShrink: 1, minWidth: 220, gap: 2 },
  kicker: { ...typeScale.label, color: colors.ink, textTransform: 'uppercase', letterSpacing: 1 },
  title: { ...typeScale.title, color: colors.ink },
  stamp: { borderWidth: 2, borderColor: colors.ink, paddingHorizontal: space.md, paddingVertical: space.sm, alignSelf: 'flex-start' },
  checksum: { fontFamily: fonts.monoBold, fontSize: 28, lineHeight: 34, letterSpacing: 3, color: colors.ink },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  fact: { minWidth: 150, gap: 2 },
  factValue: { ...typeScale.bodyStrong, color: colors.ink },
  block: { gap: space.sm },
  heading: { ...typeScale.heading, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  small: { ...typeScale.small, color: colors.ink },
});
