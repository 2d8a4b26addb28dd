import { useLocalSearchParams } from 'expo-router';

import { FitChecksScreen } from '@/components/measure/fit-checks-screen';

export default function FitChecksRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <FitChecksScreen id={id} />;
}
