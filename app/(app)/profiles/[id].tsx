import { useLocalSearchParams } from 'expo-router';

import { ProfileScreen } from '@/components/profile/profile-screen';

/** `/profiles/new` writes a library profile (or one on a job with `?job=`); `/profiles/<id>` edits one. */
export default function ProfileRoute() {
  const { id, job } = useLocalSearchParams<{ id: string; job?: string }>();
  return <ProfileScreen id={id} job={job} />;
}
