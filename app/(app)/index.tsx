import { Redirect } from 'expo-router';

import { useMeQuery } from '@/hooks/use-me';
import { roleAllows } from '@/shared/roles';

/** The start page sends each role to where its work is. */
export default function Home() {
  const role = useMeQuery().data?.activeShop?.role;
  if (roleAllows(role, { job: ['read'] })) return <Redirect href="/jobs" />;
  if (roleAllows(role, { incoming: ['read'] })) return <Redirect href="/incoming" />;
  if (roleAllows(role, { summary: ['read'] })) return <Redirect href="/my" />;
  return <Redirect href="/account" />;
}
