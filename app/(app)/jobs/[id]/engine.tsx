import { useLocalSearchParams } from 'expo-router';

import { EngineScreen } from '@/components/job/engine-screen';

export default function EngineRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <EngineScreen id={id} />;
}
