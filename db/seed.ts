import { and, eq, isNull, like } from 'drizzle-orm';

import { resolveCheckLimits, type CheckLimitOverrides } from '@/calc/checks';
import { DEMO_ENGINE, DEMO_GRINDING, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { createAuth, type Auth } from '@/server/auth';
import { createMailer } from '@/server/mail';
import { authSecret, loadDotEnv, readConfig } from '@/server/config';
import { shareUrl } from '@/server/mail/owner-mail';
import { seedChecklist } from '@/server/store/checklist';
import { latestMeasurements } from '@/server/store/measurements';
import { parseLobeTable } from '@/server/uploads/lobe-table';
import { insertShareLink } from '@/server/store/share-links';
import { analyzeForJob, revisionResults } from '@/shared/analysis';
import { jobCore } from '@/shared/job-core';
import { revisionChecksum } from '@/shared/checksum';
import { engineSchema } from '@/shared/engine';
import { lobesSchema, measurementCreateSchema } from '@/shared/measurements';
import { shareLinkLimits } from '@/shared/owner';
import { profileCreateSchema } from '@/shared/profile';
import type { ShopKind, ShopRole } from '@/shared/roles';

import { demoLobeCsv } from './demo-lobes';
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

/** The demo job's engine: calc's invented demo geometry plus a firing order. */
export const demoEngine = engineSchema.parse({ ...DEMO_ENGINE, firingOrder: '1-8-4-3-6-5-7-2' });

/** The two library profiles the builder compares; each is also copied into the demo job. */
export const demoProfiles = [
  {
    id: 'demo-profile-stock-regrind',
    jobCopyId: 'demo-job-profile-stock-regrind',
    ...profileCreateSchema.parse({
      label: 'Stock-spec regrind (demo)',
      coreNotes:
        "Demo data. Reground on the customer's own core back to the factory events; base circle cleaned up to 1.200 in, which takes the galled cylinder 3 exhaust lobe back to sound metal.",
      spec: DEMO_STOCK_REGRIND,
    }),
  },
  {
    id: 'demo-profile-towing',
    jobCopyId: 'demo-job-profile-towing',
    ...profileCreateSchema.parse({
      label: 'Towing regrind (demo)',
      coreNotes:
        'Demo data. Same core with a little more lift and duration and a tighter lobe separation for pulling a loaded trailer at low engine speed. Check piston-to-valve clearance with clay before the engine runs.',
      spec: DEMO_TOWING,
    }),
  },
];

export const demoSheetId = 'demo-sheet-flatbed-towing';
export const demoStockSheetId = 'demo-sheet-flatbed-stock';

/** What the builder tells the owner, and the two options offered (invented prices and lead times). */
export const demoOwnerPage = {
  whatFailed:
    'Demo data. One of the sixteen lifters (the part that rides on the camshaft and opens a valve) stopped rolling on cylinder 3. Its small bearings broke up and it scraped the camshaft lobe under it, which is now worn about 0.012 in (0.3 mm) lower than its neighbours. That is the ticking you heard and the loss of pull when towing. The camshaft has to be replaced or reground, all sixteen lifters are replaced with it, and the metal debris is cleaned out of the engine.',
  options: [
    {
      id: 'demo-option-stock',
      sheetId: demoStockSheetId,
      title: 'Stock-spec regrind (demo)',
      ownerNote: 'Demo data. Your own camshaft reground back to the factory timing. Drives as it did before the failure.',
      priceCents: 68_500,
      depositCents: 20_000,
      leadTimeDays: 6,
    },
    {
      id: 'demo-option-towing',
      sheetId: demoSheetId,
      title: 'Towing regrind (demo)',
      ownerNote: 'Demo data. Your own camshaft reground with a little more lift and duration, aimed at pulling the livestock trailer at low engine speed.',
      priceCents: 76_000,
      depositCents: 22_500,
      leadTimeDays: 8,
    },
  ],
} as const;

/**
 * The tech's measurements on the demo job (invented): PTV baseline with clay
 * and the old cam, the springs as measured on each head, and the pushrod and
 * preload readings. The lobe table is not seeded: the tech uploads
 * assets/demo/lobes-demo.csv in the demo.
 */
export const demoMeasurements = [
  {
    id: 'demo-measurement-ptv-baseline',
    ...measurementCreateSchema.parse({
      kind: 'ptv-baseline',
      note: 'Demo data. Clay on cylinder 1 with the old cam, light checking springs; thinnest clay over each relief.',
      data: {
        method: 'clay',
        intake: [
          { crankAngle: -10, clearance: 0.205, valveLift: 0.046 },
          { crankAngle: 10, clearance: 0.19, valveLift: 0.098 },
        ],
        exhaust: [
          { crankAngle: -10, clearance: 0.178, valveLift: 0.101 },
          { crankAngle: 10, clearance: 0.214, valveLift: 0.041 },
        ],
      },
    }),
  },
  {
    id: 'demo-measurement-springs',
    ...measurementCreateSchema.parse({
      kind: 'springs',
      note: 'Demo data. Installed heights measured with the retainers and locks in place.',
      data: {
        springs: [
          { where: 'left head', installedHeight: 1.8, seatLoad: 116, rate: 318, coilBindHeight: 1.15, retainerToSeal: 0.64 },
          { where: 'right head', installedHeight: 1.795, seatLoad: 117, rate: 321, coilBindHeight: 1.15, retainerToSeal: 0.635 },
          { where: '3E', installedHeight: 1.765, seatLoad: 121, rate: 320, coilBindHeight: 1.15, retainerToSeal: 0.62 },
        ],
      },
    }),
  },
  {
    id: 'demo-measurement-pushrod',
    ...measurementCreateSchema.parse({
      kind: 'pushrod',
      note: 'Demo data. Checking pushrod set to zero lash on cylinder 1 intake with the old cam on its base circle.',
      data: {
        checkingLength: 7.352,
        currentLength: 7.4,
        plungerTravel: 0.12,
        targetPreload: 0.045,
        originalPreload: 0.048,
        stockBaseCircle: 1.25,
        checkedOn: 'old-cam',
      },
    }),
  },
];

/** The old cam's lobe table as the tech measured it (the shipped demo CSV): cylinder 3's exhaust lobe is the damaged one. */
export const demoLobeTable = {
  id: 'demo-measurement-lobes',
  kind: 'lobes' as const,
  note: 'Demo data. The old cam on the bench, every lobe read at 2° steps; 3E is galled.',
  data: lobesSchema.parse(parseLobeTable(demoLobeCsv(), 'lobes-demo.csv')),
};

/** The demo shop's grinding settings (invented): roller, wheel, cleanup allowance and the largest cut its cores allow. */
export const demoShopLimits: CheckLimitOverrides = {
  rollerDiameter: { value: DEMO_GRINDING.rollerDiameter! },
  wheelRadius: { value: DEMO_GRINDING.wheelDiameter! / 2 },
  cleanupAllowance: { value: DEMO_GRINDING.cleanupAllowance! },
  largestCut: { value: DEMO_GRINDING.largestCut! },
};

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
    // Demo people are verified from the start; their sign-up mail is not needed.
    if (user && !user.emailVerified) {
      db.update(schema.users).set({ emailVerified: true }).where(eq(schema.users.id, user.id)).run();
      db.delete(schema.outbox).where(eq(schema.outbox.to, account.email)).run();
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
      complaint: 'Ticking from the passenger bank at idle that grew over two weeks; misfire and loss of pull when towing the livestock trailer uphill.',
      findings:
        'Cylinder 3 exhaust roller lifter seized: needle bearings broken up, roller flat-spotted. The cylinder 3 exhaust lobe is galled and about 0.012 in below its neighbours. Bearing debris in the oil pan.',
      mileage: 161000,
      status: 'teardown',
      createdBy: builder?.id ?? null,
    })
    .onConflictDoNothing()
    .run();

  const shopId = juniper.id;
  const createdBy = builder?.id ?? null;
  db.insert(schema.engines).values({ jobId: demoJobId, shopId, spec: demoEngine }).onConflictDoNothing().run();
  for (const { id, jobCopyId, label, coreNotes, spec } of demoProfiles) {
    db.insert(schema.camProfiles)
      .values([
        { id, shopId, jobId: null, label, coreNotes, spec, createdBy },
        { id: jobCopyId, shopId, jobId: demoJobId, sourceProfileId: id, label, coreNotes, spec, createdBy },
      ])
      .onConflictDoNothing()
      .run();
  }
  const tech = db.select().from(schema.users).where(eq(schema.users.email, demoAccounts[1]!.email)).get();
  for (const m of [...demoMeasurements, demoLobeTable]) {
    db.insert(schema.measurements)
      .values({ id: m.id, shopId, jobId: demoJobId, kind: m.kind, data: m.data, note: m.note, createdBy: tech?.id ?? null })
      .onConflictDoNothing()
      .run();
  }
  db.insert(schema.shopSettings).values({ shopId, limits: demoShopLimits, version: 1 }).onConflictDoNothing().run();
  // Each sheet is worked out against the job's core, as saving it in the app does.
  const job = jobCore({ measured: latestMeasurements(db, shopId, demoJobId), limits: resolveCheckLimits(demoShopLimits), lifterType: demoEngine.lifterType });
  const results = (spec: (typeof demoProfiles)[number]['spec']) => {
    const worked = analyzeForJob(demoEngine, spec, job, demoShopLimits);
    return revisionResults(worked.analysis, worked.job);
  };
  const [stock, towing] = [demoProfiles[0]!, demoProfiles[1]!];
  const sheet = (id: string, title: string, profile: (typeof demoProfiles)[number], note: string, at = new Date()) => {
    db.insert(schema.specSheets)
      .values({ id, shopId, jobId: demoJobId, profileId: profile.jobCopyId, title, createdBy, createdAt: at, updatedAt: at })
      .onConflictDoNothing()
      .run();
    db.insert(schema.sheetRevisions)
      .values({
        id: `${id}-rev-1`,
        sheetId: id,
        number: 1,
        state: 'draft',
        label: profile.label,
        spec: profile.spec,
        engine: demoEngine,
        results: results(profile.spec),
        note,
        coreNotes: profile.coreNotes,
        createdBy,
        createdAt: at,
        updatedAt: at,
      })
      .onConflictDoNothing()
      .run();
  };
  sheet(
    demoSheetId,
    'Replacement cam for the flatbed (demo)',
    towing,
    'Demo data. Draft: measure the PTV baseline with the old cam before this goes to the grinder.',
  );
  // The stock-spec sheet an hour older, so the towing sheet stays the most recent one.
  sheet(
    demoStockSheetId,
    'Stock-spec regrind for the flatbed (demo)',
    stock,
    "Demo data. Back to the factory events on the customer's own core.",
    new Date(Date.now() - 3600_000),
  );
  seedOwnerPage(db, shopId, createdBy);

  db.transaction((tx) => seedChecklist(tx, shopId, demoJobId, createdBy, (i) => `demo-checklist-${i + 1}`));
}

/** The owner's page on the demo job: the words about what failed and the two options, each bound to its sheet's first revision. */
function seedOwnerPage(db: Db, shopId: string, createdBy: string | null) {
  db.insert(schema.ownerPages).values({ jobId: demoJobId, shopId, whatFailed: demoOwnerPage.whatFailed }).onConflictDoNothing().run();
  demoOwnerPage.options.forEach((option, i) => {
    const revision = db
      .select()
      .from(schema.sheetRevisions)
      .where(eq(schema.sheetRevisions.id, `${option.sheetId}-rev-1`))
      .get();
    if (!revision) return;
    db.insert(schema.ownerOptions)
      .values({ ...option, shopId, jobId: demoJobId, revisionId: revision.id, checksum: revisionChecksum(revision), position: i + 1, createdBy })
      .onConflictDoNothing()
      .run();
  });
}

/**
 * A fresh share link for the demo owner, printed by the seed (only the token's
 * hash is stored, so an earlier link cannot be printed again). Earlier demo
 * links are withdrawn so one stays open.
 */
export function newDemoShareLink(db: Db, baseURL: string) {
  const { token } = db.transaction((tx) => {
    tx.update(schema.shareLinks)
      .set({ revokedAt: new Date() })
      .where(and(like(schema.shareLinks.id, 'demo-link-%'), isNull(schema.shareLinks.revokedAt)))
      .run();
    return insertShareLink(tx, {
      id: `demo-link-${crypto.randomUUID()}`,
      shopId: juniper.id,
      jobId: demoJobId,
      // The demo owner's account finds the page too.
      email: demoAccounts.find((a) => a.role === 'customer')!.email,
      days: shareLinkLimits.defaultDays,
      createdBy: null,
    });
  });
  return shareUrl(baseURL, token);
}

export function demoSignInText(baseURL: string) {
  const lines = demoAccounts.map((a) => `  ${a.role.padEnd(9)} ${a.email}`);
  return [`Demo sign-ins at ${baseURL} (password for all: ${demoPassword}):`, ...lines].join('\n');
}

// Run as `tsx db/seed.ts`; the server imports this file (and is bundled with it), and must not seed.
if (require.main === module && /db[\\/]seed\.ts$/.test(process.argv[1] ?? '')) {
  loadDotEnv();
  const config = readConfig();
  if (config.mode === 'production') {
    console.log('Production mode (NODE_ENV=production): no demo data is seeded.');
    process.exit(0);
  }
  const db = openDb(config.databasePath);
  seedDemo(db, createAuth({ db, baseURL: config.baseURL, secret: authSecret(config), mailer: createMailer({ db }) }))
    .then(() => {
      console.log(`Demo data is in ${config.databasePath}.`);
      console.log(`Demo owner's summary (no sign-in needed): ${newDemoShareLink(db, config.baseURL)}`);
      db.$client.close();
    })
    .catch((error: unknown) => {
      console.error(error);
      process.exit(1);
    });
}
