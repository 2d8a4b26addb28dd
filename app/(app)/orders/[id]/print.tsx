import { useLocalSearchParams } from 'expo-router';

import { PrintScreen } from '@/components/order/print-screen';

export default function PrintOrder() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <PrintScreen id={id} />;
}
