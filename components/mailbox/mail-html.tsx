import { StyleSheet, Text } from 'react-native';

import { colors, fonts, radius, space } from '@/constants/theme';

/** The phone apps show the HTML part as its source text; the web build renders it in a sandboxed frame. */
export function MailHtml({ html, title }: { html: string; title: string }) {
  return (
    <Text style={styles.source} selectable aria-label={title} testID="mail-html">
      {html}
    </Text>
  );
}

const styles = StyleSheet.create({
  source: {
    fontFamily: fonts.mono,
    fontSize: 12,
    lineHeight: 17,
    color: colors.ink,
    backgroundColor: colors.sunken,
    padding: space.md,
    borderRadius: radius.md,
  },
});
