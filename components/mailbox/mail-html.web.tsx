import { StyleSheet, View } from 'react-native';

import { colors, radius } from '@/constants/theme';

/** The HTML part in a sandboxed frame: no scripts, no forms, no access to Lobewright's page. */
export function MailHtml({ html, title }: { html: string; title: string }) {
  return (
    <View style={styles.frame}>
      <iframe
        title={title}
        sandbox=""
        srcDoc={html}
        style={{ border: 0, width: '100%', height: 420, backgroundColor: colors.surface }}
        data-testid="mail-html"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  frame: { borderWidth: 1, borderColor: colors.line, borderRadius: radius.md, overflow: 'hidden' },
});
