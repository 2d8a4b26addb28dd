import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { StyleSheet, Text } from 'react-native';

import { AuthCard } from '@/components/account/auth-card';
import { Button } from '@/components/ui/button';
import { colors, type as typeScale } from '@/constants/theme';
import { invalidateMe } from '@/hooks/use-me';

/** Where the verification link lands. better-auth adds ?error= when the link was wrong or too old. */
export function VerifiedScreen({ error }: { error?: string }) {
  const queryClient = useQueryClient();
  useEffect(() => {
    // Verifying can sign the person in and open a shop: read who they are again.
    void invalidateMe(queryClient);
  }, [queryClient]);
  if (error) {
    return (
      <AuthCard title="This link did not work" intro="It may be older than a day or already used.">
        <Text style={styles.body}>Sign in and ask for a new link from the notice at the top of the screen.</Text>
        <Button label="Go to Lobewright" href="/" testID="verified-continue" />
      </AuthCard>
    );
  }
  return (
    <AuthCard title="E-mail verified" intro="Thank you: your address is confirmed.">
      <Text style={styles.body} testID="verified-message">
        Any shop that invited you is now open to you.
      </Text>
      <Button label="Go to Lobewright" href="/" testID="verified-continue" />
    </AuthCard>
  );
}

const styles = StyleSheet.create({ body: { ...typeScale.body, color: colors.inkMuted } });
