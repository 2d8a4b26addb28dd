import { MyJobsScreen } from '@/components/owner/my-jobs-screen';

/** A signed-in owner's vehicles: each summary a shop sent to their e-mail. */
export default function MyJobsRoute() {
  return <MyJobsScreen />;
}
