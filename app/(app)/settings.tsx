import { SettingsScreen } from '@/components/account/settings-screen';

export default function SettingsRoute() {
  return <SettingsScreen />;
}
