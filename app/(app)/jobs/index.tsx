import { JobsScreen } from '@/components/job/jobs-screen';

export default function Jobs() {
  return <JobsScreen />;
}
