import { useLocalSearchParams } from 'expo-router';

import { VerifiedScreen } from '@/components/account/verified-screen';

/** Where the verification link lands. better-auth adds ?error= when the link was wrong or too old. */
export default function Verified() {
  const { error } = useLocalSearchParams<{ error?: string }>();
  return <VerifiedScreen error={error} />;
}
