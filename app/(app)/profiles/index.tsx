import { Screen } from '@/components/screen';

export default function Profiles() {
  return <Screen title="Profile library" testID="profiles-screen">{null}</Screen>;
}
