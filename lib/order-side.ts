import { roleAllows } from '@/shared/roles';

import type { OrderSide } from '@/components/order/order-moves';

/** Which side of an order the active role acts for: the grinding shop, the repair shop's builder, or neither (read only). */
export function orderSide(role: string | null | undefined): OrderSide | null {
  if (roleAllows(role, { incoming: ['respond'] })) return 'grinder';
  if (roleAllows(role, { sheet: ['issue'] })) return 'builder';
  return null;
}
