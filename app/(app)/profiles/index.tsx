import { ProfilesScreen } from '@/components/profile/profiles-screen';

export default function Profiles() {
  return <ProfilesScreen />;
}
