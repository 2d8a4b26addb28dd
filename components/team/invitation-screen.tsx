import { StyleSheet, Text, View } from 'react-native';

import { AuthCard } from '@/components/account/auth-card';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { colors, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useMeQuery } from '@/hooks/use-me';
import { useAnswerInvitationMutation, useInvitationQuery } from '@/hooks/use-team';
import { roleLabels } from '@/shared/roles';

/** Where an invitation mail lands: the invited person signs in with that address, verifies it, then accepts or declines. */
export function InvitationScreen({ id }: { id: string }) {
  const me = useMeQuery();
  const signedIn = Boolean(me.data);
  const invitation = useInvitationQuery(id, signedIn);
  const answer = useAnswerInvitationMutation(id);

  if (me.isPending) return <Pending label="Opening the invitation…" />;
  if (!signedIn) {
    return (
      <AuthCard title="You are invited to a shop" intro="Sign in, or create an account, with the address this invitation was sent to.">
        <View style={styles.buttons}>
          <Button label="Create an account" href="/sign-up?join=1" testID="invitation-sign-up" />
          <Button label="Sign in" variant="secondary" href="/sign-in" testID="invitation-sign-in" />
        </View>
        <Text style={styles.body}>Then open the link in the mail again.</Text>
      </AuthCard>
    );
  }
  if (invitation.isPending) return <Pending label="Opening the invitation…" />;
  if (invitation.isError) {
    const missing = invitation.error instanceof ApiError && invitation.error.status === 404;
    return (
      <AuthCard
        title={missing ? 'No invitation for you here' : 'The invitation did not open'}
        intro={missing ? `This invitation was not sent to ${me.data!.user.email}.` : ''}
      >
        {missing ? (
          <Text style={styles.body}>Sign in with the address the mail went to.</Text>
        ) : (
          <ErrorNotice error={invitation.error} onRetry={() => invitation.refetch()} />
        )}
        <Button label="Go to Lobewright" href="/" variant="secondary" testID="invitation-home" />
      </AuthCard>
    );
  }
  const view = invitation.data;
  const role = roleLabels[view.role].toLowerCase();
  const words: Record<typeof view.status, { title: string; intro: string }> = {
    pending: { title: `Join ${view.shopName}`, intro: `You are invited to work at ${view.shopName} as ${role}.` },
    accepted: { title: `You work at ${view.shopName}`, intro: `You joined as ${role}.` },
    rejected: { title: 'Invitation declined', intro: `You turned down the invitation to ${view.shopName}.` },
    canceled: { title: 'Invitation withdrawn', intro: `${view.shopName} withdrew this invitation. Ask them for a new one.` },
    expired: { title: 'Invitation expired', intro: `This invitation to ${view.shopName} has run out. Ask them for a new one.` },
  };
  const { title, intro } = words[view.status];
  return (
    <AuthCard title={title} intro={intro}>
      <Text style={styles.status} testID="invitation-status">
        {view.status === 'pending' && !view.verified
          ? 'Verify your e-mail address first: open the link in the mail we sent you. The shop opens as soon as you do.'
          : intro}
      </Text>
      {view.status === 'pending' && view.verified ? (
        <View style={styles.buttons}>
          <Button
            label={`Join ${view.shopName}`}
            busy={answer.isPending && answer.variables === 'accept'}
            onPress={() => answer.mutate('accept')}
            testID="invitation-accept"
          />
          <Button
            label="Decline"
            variant="secondary"
            busy={answer.isPending && answer.variables === 'decline'}
            onPress={() => answer.mutate('decline')}
            testID="invitation-decline"
          />
        </View>
      ) : (
        <Button label="Go to Lobewright" href="/" testID="invitation-home" />
      )}
      {answer.isError ? <ErrorNotice error={answer.error} /> : null}
    </AuthCard>
  );
}

const styles = StyleSheet.create({
  body: { ...typeScale.body, color: colors.inkMuted },
  status: { ...typeScale.bodyStrong, color: colors.ink },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
