import { useLocalSearchParams } from 'expo-router';

import { ResetPasswordScreen } from '@/components/account/reset-password-screen';

/** Where the reset link lands (?token=, or ?error= when the link is bad or too old). */
export default function ResetPassword() {
  const { token, error } = useLocalSearchParams<{ token?: string; error?: string }>();
  return <ResetPasswordScreen token={token} error={error} />;
}
