import { useLocalSearchParams } from 'expo-router';

import { MeasurementsScreen } from '@/components/measure/measurements-screen';

export default function MeasurementsRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <MeasurementsScreen id={id} />;
}
