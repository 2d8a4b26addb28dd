import { useLocalSearchParams } from 'expo-router';

import { OwnerDeskScreen } from '@/components/owner/lazy-owner';

/** The builder's side of the owner's page: the words, the options and prices, the links, and what the owner did. */
export default function OwnerDeskRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <OwnerDeskScreen id={id} />;
}
