import { useLocalSearchParams } from 'expo-router';

import { OrderScreen } from '@/components/order/order-screen';

export default function OrderPage() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <OrderScreen id={id} />;
}
