import { useLocalSearchParams } from 'expo-router';

import { CompareScreen } from '@/components/compare/compare-screen';

export default function Compare() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <CompareScreen id={id} />;
}
