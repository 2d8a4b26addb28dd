import { StyleSheet, Text, View } from 'react-native';

import { colors, space, type as typeScale } from '@/constants/theme';
import { useInstanceQuery } from '@/hooks/use-instance';

const fakeNames = { payments: 'test payments, no real money', mailbox: 'mail kept in the dev mailbox' } as const;

/** A strip on every screen of a demo server: the data is invented and the fakes it runs are named. Nothing in production. */
export function DemoBanner() {
  const instance = useInstanceQuery().data;
  if (instance?.mode !== 'demo') return null;
  const fakes = instance.fakes.map((f) => fakeNames[f]);
  return (
    <View style={styles.banner} role="note" aria-label="Demo server" testID="demo-banner">
      <Text style={styles.text}>
        <Text style={styles.strong}>Demo server</Text> · invented data{fakes.map((f) => ` · ${f}`).join('')}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  banner: { backgroundColor: colors.ink, paddingHorizontal: space.md, paddingVertical: space.xs },
  text: { ...typeScale.small, color: colors.paper, textAlign: 'center' },
  strong: { fontWeight: '700' },
});
