import { useLocalSearchParams } from 'expo-router';

import { OwnerSummary } from '@/components/owner/lazy-owner';
import { ownerApiBase } from '@/hooks/use-owner-page';

/** The owner's summary opened from a share link, with no account. */
export default function SharedSummaryScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <OwnerSummary base={ownerApiBase.link(token)} />;
}
