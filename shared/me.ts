import { z } from 'zod';

import { shopKinds, type ShopKind, type ShopRole } from './roles';

export type MeShop = { id: string; name: string; kind: ShopKind; role: ShopRole };

export type Me = {
  user: { id: string; name: string; email: string; emailVerified: boolean };
  shops: MeShop[];
  activeShop: MeShop | null;
};

/** An e-mail address as every form takes it: compared in lower case. */
export const emailAddress = z
  .email('Enter an e-mail address like name@example.com')
  .max(254, 'Keep the address under 254 characters')
  .transform((e) => e.toLowerCase());

export const activeShopSchema = z.strictObject({
  shopId: z.string({ error: 'Choose a shop' }).min(1, 'Choose a shop'),
});

export const shopCreateSchema = z.strictObject({
  name: z.string({ error: 'Name the shop' }).trim().min(2, 'Name the shop').max(120, 'Keep the shop name under 120 characters'),
  kind: z.enum(shopKinds, { error: 'A shop is a repair shop or a grinding shop' }),
});
export type ShopCreate = z.input<typeof shopCreateSchema>;
