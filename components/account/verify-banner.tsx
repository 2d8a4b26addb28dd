import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import { useResendVerificationMutation } from '@/hooks/use-me';

/** Shown while the signed-in person's address is not verified: shops they were invited to stay closed until it is. */
export function VerifyBanner({ email }: { email: string }) {
  const resend = useResendVerificationMutation();
  return (
    <View style={styles.banner} role="alert" testID="verify-banner">
      <Text style={styles.title}>Verify your e-mail</Text>
      <Text style={styles.body}>We sent a link to {email}. Open it to confirm the address; shops that invited you open once it is verified.</Text>
      {resend.isSuccess ? <Text style={styles.body}>A new link is on its way.</Text> : null}
      {resend.isError ? <Text style={styles.body}>The link could not be sent. Try again in a minute.</Text> : null}
      <View style={styles.actions}>
        <Button label="Send the link again" variant="secondary" busy={resend.isPending} onPress={() => resend.mutate(email)} testID="verify-resend" />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  banner: {
    gap: space.sm,
    margin: space.md,
    padding: space.lg,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.watch,
    backgroundColor: colors.watchSoft,
  },
  title: { ...typeScale.bodyStrong, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  actions: { flexDirection: 'row', flexWrap: 'wrap' },
});
