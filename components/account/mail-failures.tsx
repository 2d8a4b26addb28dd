import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, space, type as typeScale } from '@/constants/theme';
import { useMailFailuresQuery, useRetryMailMutation } from '@/hooks/use-shop-mail';

import { Button } from '@/components/ui/button';
import { listRow } from '@/components/ui/list-row';
import { ErrorNotice, Pending } from '@/components/ui/query-state';

/** Mail about the shop that did not go out after every try, each with the mail server's last answer and a way to send it again. */
export function MailFailures() {
  const failures = useMailFailuresQuery();
  const retry = useRetryMailMutation();
  if (failures.isPending) return <Pending label="Loading undelivered mail…" />;
  if (failures.isError) return <ErrorNotice error={failures.error} onRetry={() => failures.refetch()} />;
  const list = failures.data.failures;
  if (list.length === 0) return <Text style={styles.meta}>Every mail about this shop went out (or is still being tried).</Text>;
  return (
    <View role="list" aria-label="Undelivered mail" style={styles.list} testID="mail-failures">
      {retry.isError ? <ErrorNotice error={retry.error} /> : null}
      {list.map((mail) => (
        <View key={mail.id} role="listitem" style={styles.row}>
          <View style={styles.what}>
            <Text style={styles.subject}>{mail.subject}</Text>
            <Text style={styles.meta}>
              To {mail.to} · written {formatDateTime(mail.createdAt)} · {mail.attempts} {mail.attempts === 1 ? 'try' : 'tries'}
            </Text>
            <Text style={styles.error}>Last answer: {mail.lastError || 'none'}</Text>
          </View>
          <Button label="Send again" variant="secondary" busy={retry.isPending && retry.variables === mail.id} onPress={() => retry.mutate(mail.id)} />
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { ...listRow, backgroundColor: colors.failSoft, borderColor: colors.fail },
  what: { flexGrow: 1, flexShrink: 1, flexBasis: 240, gap: 2 },
  subject: { ...typeScale.bodyStrong, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  error: { ...typeScale.small, color: colors.fail },
});
