import { Link, usePathname, type Href } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, touchTarget } from '@/constants/theme';

export type NavItem = { href: Href; match: string; label: string; glyph: string; testID: string };

type NavBarProps = { items: NavItem[]; wide: boolean; shopName?: string };

/** Bottom bar on a phone; a side rail with the shop's name on a wide screen. */
export function NavBar({ items, wide, shopName }: NavBarProps) {
  const pathname = usePathname();
  return (
    <View role="navigation" aria-label="Main" style={wide ? styles.rail : styles.bar} data-print="hide">
      {wide ? (
        <View style={styles.brand}>
          <Text style={styles.wordmark}>Lobewright</Text>
          {shopName ? <Text style={styles.shop}>{shopName}</Text> : null}
        </View>
      ) : null}
      {items.map((item) => {
        const active = pathname === item.match || pathname.startsWith(`${item.match}/`);
        return (
          <Link
            key={item.testID}
            href={item.href}
            aria-current={active ? 'page' : undefined}
            style={[wide ? styles.railItem : styles.barItem, active && styles.active]}
            testID={item.testID}
          >
            <Text aria-hidden style={[styles.glyph, active && styles.activeText]}>
              {item.glyph}
            </Text>
            <Text style={[wide ? styles.railLabel : styles.barLabel, active && styles.activeText]}>{item.label}</Text>
          </Link>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    backgroundColor: colors.surface,
    borderTopWidth: 1,
    borderTopColor: colors.line,
    paddingHorizontal: space.sm,
    paddingVertical: space.xs,
    gap: space.xs,
  },
  rail: {
    width: 220,
    backgroundColor: colors.surface,
    borderRightWidth: 1,
    borderRightColor: colors.line,
    padding: space.md,
    gap: space.xs,
  },
  brand: { paddingHorizontal: space.sm, paddingVertical: space.lg, gap: space.xs },
  wordmark: { fontFamily: fonts.bold, fontSize: 22, color: colors.accent, letterSpacing: 0.5 },
  shop: { fontFamily: fonts.medium, fontSize: 14, color: colors.inkMuted },
  barItem: {
    display: 'flex',
    flexDirection: 'column',
    flex: 1,
    minHeight: touchTarget + 8,
    alignItems: 'center',
    justifyContent: 'center',
    borderRadius: radius.md,
    gap: 2,
  },
  railItem: {
    display: 'flex',
    minHeight: touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
  },
  active: { backgroundColor: colors.accentSoft },
  glyph: { fontFamily: fonts.monoBold, fontSize: 20, color: colors.inkMuted, width: 20, textAlign: 'center' },
  barLabel: { fontFamily: fonts.medium, fontSize: 13, color: colors.inkMuted },
  railLabel: { fontFamily: fonts.medium, fontSize: 16, color: colors.ink },
  activeText: { color: colors.accent, fontFamily: fonts.semibold },
});
