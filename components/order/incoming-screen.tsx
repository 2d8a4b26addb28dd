import { Link } from 'expo-router';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { LoadMore } from '@/components/ui/load-more';
import { FirmnessChip } from '@/components/order/order-firmness';
import { OrderStageChip } from '@/components/order/order-stage-chip';
import { SupersededChip } from '@/components/order/superseded';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen } from '@/components/ui/screen';
import { formatAge } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useIncomingQuery } from '@/hooks/use-orders';
import { useMeQuery } from '@/hooks/use-me';
import type { Order } from '@/shared/orders';

/** The grinding shop's inbox: every sheet revision issued to it, newest first, a page at a time. */
export function IncomingScreen() {
  const shopName = useMeQuery().data?.activeShop?.name;
  const incoming = useIncomingQuery();
  const wide = useWindowDimensions().width >= breakpoints.wide;
  // The server sends the newest order first, page after page; sorting again would move rows between pages.
  const orders = incoming.data ?? [];
  return (
    <Screen title="Incoming" subtitle={shopName ? `Spec sheets issued to ${shopName}` : 'Spec sheets issued to your shop'} testID="incoming-screen">
      {incoming.isPending ? <Pending label="Loading incoming sheets…" /> : null}
      {incoming.isError ? <ErrorNotice error={incoming.error} onRetry={() => incoming.refetch()} /> : null}
      {incoming.data && orders.length === 0 ? (
        <EmptyState title="Nothing issued to you yet">
          <Text style={styles.body}>When a repair shop issues a spec sheet to your shop, it arrives here with its checksum.</Text>
        </EmptyState>
      ) : null}
      {orders.length > 0 ? (
        <View role="list" style={[styles.list, wide && styles.grid]} testID="incoming-list">
          {orders.map((o) => (
            <IncomingCard key={o.id} order={o} wide={wide} />
          ))}
        </View>
      ) : null}
      <LoadMore hasMore={incoming.hasNextPage} loading={incoming.isFetchingNextPage} onLoadMore={() => void incoming.fetchNextPage()} />
    </Screen>
  );
}

function IncomingCard({ order, wide }: { order: Order; wide: boolean }) {
  const age = formatAge(order.issuedAt);
  return (
    <View role="listitem" style={[styles.cardWrap, wide && styles.cardHalf]}>
      <Link href={{ pathname: '/orders/[id]', params: { id: order.id } }} style={styles.card} testID={`incoming-${order.id}`}>
        <View style={styles.cardInner}>
          <View style={styles.head}>
            <OrderStageChip stage={order.stage} />
            <FirmnessChip order={order} testID="incoming-firmness" />
            <SupersededChip supersededBy={order.supersededBy} testID="incoming-superseded" />
            <Text style={styles.age} testID="incoming-age">
              {age === 'just now' ? 'Sent just now' : `Sent ${age} ago`}
            </Text>
          </View>
          <Text style={styles.title}>{order.sheetTitle}</Text>
          <Text style={styles.body}>{order.repairShop.name}</Text>
          <Text style={styles.meta}>
            Revision {order.revisionNumber} · checksum <Text style={styles.mono}>{order.checksum}</Text>
          </Text>
        </View>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  grid: { flexDirection: 'row', flexWrap: 'wrap' },
  cardWrap: { width: '100%' },
  cardHalf: { width: '49%', flexGrow: 1, flexBasis: 360 },
  card: { display: 'flex', padding: space.lg, backgroundColor: colors.surface, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line },
  cardInner: { gap: space.xs, width: '100%' },
  head: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  age: { ...typeScale.small, color: colors.inkMuted },
  title: { ...typeScale.heading, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  mono: { fontFamily: fonts.mono, color: colors.ink },
});
