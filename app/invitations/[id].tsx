import { useLocalSearchParams } from 'expo-router';

import { InvitationScreen } from '@/components/team/invitation-screen';

/** Where an invitation mail lands: the invited person signs in with that address, verifies it, then accepts or declines. */
export default function InvitationRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <InvitationScreen id={id} />;
}
