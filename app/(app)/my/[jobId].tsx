import { useLocalSearchParams } from 'expo-router';

import { OwnerSummary } from '@/components/owner/lazy-owner';
import { ownerApiBase } from '@/hooks/use-owner-page';

/** A signed-in owner's summary of one job. */
export default function MyJobScreen() {
  const { jobId } = useLocalSearchParams<{ jobId: string }>();
  return <OwnerSummary base={ownerApiBase.account(jobId)} />;
}
