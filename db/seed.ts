import { eq } from 'drizzle-orm';

import { createAuth, type Auth } from '@/server/auth';
import { readConfig } from '@/server/config';
import type { ShopKind, ShopRole } from '@/shared/roles';

import { openDb, schema, type Db } from './index';

// Demo data: an invented scenario. No real shop, person or vehicle.

export const demoPassword = 'lobewright-demo';

type DemoShop = { id: string; name: string; slug: string; kind: ShopKind };
const juniper: DemoShop = {
  id: 'demo-shop-juniper-flats',
  name: 'Juniper Flats Engine Works (demo)',
  slug: 'juniper-flats-engine-works',
  kind: 'repair',
};
const kestrel: DemoShop = {
  id: 'demo-shop-kestrel-valley',
  name: 'Kestrel Valley Regrind (demo)',
  slug: 'kestrel-valley-regrind',
  kind: 'grinding',
};

export const demoAccounts: { email: string; name: string; role: ShopRole; shop: DemoShop }[] = [
  { email: 'builder@juniper-flats.example', name: 'Marisol Tenney (demo builder)', role: 'builder', shop: juniper },
  { email: 'tech@juniper-flats.example', name: 'Obie Lusk (demo tech)', role: 'tech', shop: juniper },
  { email: 'grinder@kestrel-valley.example', name: 'Hal Pruett (demo grinder)', role: 'grinder', shop: kestrel },
  { email: 'owner@juniper-flats.example', name: 'Delia Carrow (demo owner)', role: 'customer', shop: juniper },
];

export const demoJobId = 'demo-job-flatbed-cam';

/** Writes the demo shops, people and job. Safe to run again: it only adds what is missing. */
export async function seedDemo(db: Db, auth: Auth) {
  for (const shop of [juniper, kestrel]) {
    db.insert(schema.shops).values(shop).onConflictDoNothing().run();
  }
  for (const account of demoAccounts) {
    let user = db.select().from(schema.users).where(eq(schema.users.email, account.email)).get();
    if (!user) {
      await auth.api.signUpEmail({ body: { email: account.email, password: demoPassword, name: account.name } });
      user = db.select().from(schema.users).where(eq(schema.users.email, account.email)).get();
    }
    if (!user) throw new Error(`Could not create demo account ${account.email}`);
    db.insert(schema.memberships)
      .values({ id: `demo-member-${account.role}`, organizationId: account.shop.id, userId: user.id, role: account.role })
      .onConflictDoNothing()
      .run();
  }
  const builder = db.select().from(schema.users).where(eq(schema.users.email, demoAccounts[0]!.email)).get();
  db.insert(schema.jobs)
    .values({
      id: demoJobId,
      shopId: juniper.id,
      vehicle: 'One-ton flatbed, 5.9 L pushrod V8 (demo)',
      customerName: 'Delia Carrow (demo)',
      complaint:
        'Ticking from the passenger bank at idle that grew over two weeks; misfire and loss of pull when towing the livestock trailer uphill.',
      findings:
        'Cylinder 3 exhaust roller lifter seized: needle bearings broken up, roller flat-spotted. The cylinder 3 exhaust lobe is galled and about 0.012 in below its neighbours. Bearing debris in the oil pan.',
      mileage: 161000,
      status: 'teardown',
      createdBy: builder?.id ?? null,
    })
    .onConflictDoNothing()
    .run();
}

export function demoSignInText(baseURL: string) {
  const lines = demoAccounts.map((a) => `  ${a.role.padEnd(9)} ${a.email}`);
  return [`Demo sign-ins at ${baseURL} (password for all: ${demoPassword}):`, ...lines].join('\n');
}

if (require.main === module) {
  const config = readConfig();
  const db = openDb(config.databasePath);
  seedDemo(db, createAuth({ db, baseURL: config.baseURL, secret: config.secret }))
    .then(() => {
      console.log(`Demo data is in ${config.databasePath}.`);
      db.$client.close();
    })
    .catch((error: unknown) => {
      console.error(error);
      process.exit(1);
    });
}
