import { Redirect } from 'expo-router';

import { useMeQuery } from '@/hooks/use-me';
import { roleAllows } from '@/shared/roles';

/** The start page sends each role to where its work is. */
export default function Home() {
  const role = useMeQuery().data?.activeShop?.role;
  return <Redirect href={roleAllows(role, { job: ['read'] }) ? '/jobs' : '/account'} />;
}
