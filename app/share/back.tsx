import { useLocalSearchParams } from 'expo-router';

import { OwnerReturnScreen } from '@/components/owner/owner-return-screen';

/** Back from the payment page: on to the summary this tab came from, with the payment session to check. */
export default function OwnerReturnRoute() {
  const { deposit } = useLocalSearchParams<{ deposit?: string }>();
  return <OwnerReturnScreen deposit={deposit} />;
}
