import { useLocalSearchParams } from 'expo-router';

import { JobScreen } from '@/components/job/job-screen';

export default function JobPage() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <JobScreen id={id} />;
}
