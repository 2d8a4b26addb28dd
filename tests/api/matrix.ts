import { openDb } from '@/db';
import { createApp } from '@/server/app';
import { formWith, makeEngineSpec, makeJobBody, makeProfileBody, makeProfileSpec } from '@/tests/fixtures';

import { isApiPath, routeTable } from './routes';

import { actors, lobeCsvText, PNG, shopAMembers, shopAReaders, type Actor, type World } from './world';

/**
 * One row per API route: who gets through, and a request that succeeds for them.
 * Everyone not in `allow` must get 401 (anonymous) or 403/404, with the database,
 * the uploads folder and every response free of shop A's records.
 */
export type MatrixRow = {
  /** Who passes authorization (answers 2xx, or 409 for a stale version or an illegal move). */
  allow: readonly Actor[];
  /** Path parameters, by name, from the world's records. */
  params?: (w: World) => Record<string, string>;
  /** A query string (without `?`) every call sends, for routes that read one. */
  query?: (w: World) => string;
  /** The body an allowed actor sends: JSON, or a FormData for uploads. */
  body?: (w: World, who: Actor) => unknown;
  /** Why the row may show shop A's records to people outside it. */
  showsEveryone?: string;
  /**
   * The owner's page (a share link, or the owner signed in): why its callers may act on
   * shop A's job. Whoever calls it sees only markers marked `onOwnerPage`, readers or not.
   */
  ownerPage?: string;
  /** Why an allowed caller outside shop A may change A's records (the person A invited, taking up or turning down the invitation). */
  changesShopA?: string;
  /**
   * A route no actor passes by who they are (a signed webhook): every actor's call,
   * made without the secret, must be refused with this status and change nothing.
   */
  refusedAs?: { status: number; why: string };
};

const signedIn = actors.filter((a) => a !== 'anonymous');
/** Builder and tech of each repair shop (job read and measurement read/write, each in their own shop). */
const bothShopsReaders: Actor[] = [...shopAReaders, 'B.builder', 'B.tech'];
const bothBuilders: Actor[] = ['A.builder', 'B.builder'];
const builderA: Actor[] = ['A.builder'];
const orderReaders: Actor[] = [...shopAReaders, 'G1.grinder'];
const teamManagers: Actor[] = ['A.builder', 'B.builder', 'G1.grinder', 'G2.grinder'];
const bTechInvitation = (w: World) => ({ id: w.a.bTechInvitationId });
const invitedSees = "the person A invited (B's tech) sees A's name and the role offered, nothing of A's records";

const job = (w: World) => ({ jobId: w.a.jobId });
const sheet = (w: World) => ({ id: w.a.sheetId });
const order = (w: World) => ({ id: w.a.orderId });
const option = (w: World) => ({ id: w.a.optionId });
const token = (w: World) => ({ token: w.a.shareToken });
const paidToken = (w: World) => ({ token: w.a.paidToken });
const paidJob = (w: World) => ({ jobId: w.a.paidJobId });
const sharePhoto = (w: World) => ({ photoId: w.a.sharePhotoId });
const approve = (w: World) => ({ optionId: w.a.optionId, checksum: w.a.optionChecksum, offer: w.a.optionOffer, name: 'Test Owner', agree: true });
const confirm = (w: World) => ({ sessionId: w.a.paidSessionId });

const byToken = 'anyone holding the link is the owner: the 256-bit token is the secret (a wrong one is 404 for everyone, checked in matrix.test.ts)';
const byAccount = "A's customer, signed in, to whose e-mail the builder sent the link; other shops' customers and staff are refused";
/** The owner's page and its actions, the same at /api/share/:token and /api/my/jobs/:jobId. */
const ownerRoutes = (
  prefix: string,
  allow: readonly Actor[],
  ownerPage: string,
  job: (w: World) => Record<string, string>,
  paid: (w: World) => Record<string, string>,
) => ({
  [`GET ${prefix}`]: { allow, ownerPage, params: job },
  [`GET ${prefix}/photos/:photoId`]: { allow, ownerPage, params: (w: World) => ({ ...job(w), ...sharePhoto(w) }) },
  [`POST ${prefix}/approve`]: { allow, ownerPage, params: job, body: approve },
  [`POST ${prefix}/deposit`]: { allow, ownerPage, params: paid },
  [`POST ${prefix}/deposit/confirm`]: { allow, ownerPage, params: paid, body: confirm },
});

/**
 * The expected table. Add a row for every new route, keyed `METHOD /path` exactly as
 * the app registers it (the suite names any route without a row).
 */
export const matrix: Record<string, MatrixRow> = {
  'GET /api/health': { allow: actors },
  'GET /api/instance': { allow: actors },

  'GET /api/me': { allow: signedIn },
  'POST /api/me/active-shop': { allow: shopAMembers, body: (w) => ({ shopId: w.a.shopId }) },
  'POST /api/shops': { allow: signedIn, body: () => ({ name: 'Test Shop C', kind: 'repair' }) },

  'GET /api/jobs': { allow: bothShopsReaders, query: () => 'limit=200' },
  'POST /api/jobs': { allow: bothBuilders, body: () => makeJobBody() },
  'GET /api/jobs/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.jobId }) },
  'GET /api/jobs/:id/lifecycle': { allow: shopAReaders, params: (w) => ({ id: w.a.jobId }) },
  'PATCH /api/jobs/:id': {
    allow: builderA,
    params: (w) => ({ id: w.a.jobId }),
    body: (w) => ({ version: w.a.jobVersion, findings: 'Lobe 3E galled' }),
  },

  'GET /api/jobs/:jobId/engine': { allow: shopAReaders, params: job },
  'PUT /api/jobs/:jobId/engine': { allow: builderA, params: job, body: () => ({ version: 1, engine: makeEngineSpec({ chamberCc: 70 }) }) },

  'GET /api/profiles': { allow: bothShopsReaders },
  'POST /api/profiles': { allow: bothBuilders, body: () => makeProfileBody({ label: 'Test stock grind' }) },
  'GET /api/profiles/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.libraryProfileId }) },
  'PATCH /api/profiles/:id': { allow: builderA, params: (w) => ({ id: w.a.libraryProfileId }), body: () => ({ version: 1, coreNotes: 'Core checked' }) },
  'DELETE /api/profiles/:id': { allow: builderA, params: (w) => ({ id: w.a.libraryProfileId }) },
  'GET /api/jobs/:jobId/profiles': { allow: shopAReaders, params: job },
  'POST /api/jobs/:jobId/profiles': { allow: builderA, params: job, body: (w) => ({ fromProfileId: w.a.libraryProfileId }) },

  'GET /api/jobs/:jobId/sheets': { allow: shopAReaders, params: job },
  'POST /api/jobs/:jobId/sheets': { allow: builderA, params: job, body: (w) => ({ title: 'Test second sheet', profileId: w.a.spareProfileId }) },
  'GET /api/sheets/:id': { allow: shopAReaders, params: sheet },
  'GET /api/sheets/:id/revisions/:number': { allow: shopAReaders, params: (w) => ({ ...sheet(w), number: '1' }) },
  'PATCH /api/sheets/:id': {
    allow: builderA,
    params: sheet,
    body: (w) => ({ version: w.a.sheetVersion, spec: makeProfileSpec({ icl: 108 }) }),
  },

  'POST /api/calc/analyze': { allow: signedIn, body: () => ({ engine: makeEngineSpec(), profiles: [makeProfileSpec()], curves: false }) },

  'GET /api/jobs/:jobId/measurements': { allow: shopAReaders, params: job },
  'POST /api/jobs/:jobId/measurements': {
    allow: shopAReaders,
    params: job,
    body: () => ({ kind: 'pushrod', data: { checkingLength: 7.35, plungerTravel: 0.12, targetPreload: 0.045, stockBaseCircle: 1.25 } }),
  },
  'POST /api/jobs/:jobId/measurements/lobes': {
    allow: shopAReaders,
    params: job,
    body: () => formWith([['file', 'lobes.csv', lobeCsvText(), 'text/csv']]),
  },
  'GET /api/measurements/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.measurementId }) },
  'PATCH /api/measurements/:id': {
    allow: shopAReaders,
    params: (w) => ({ id: w.a.measurementId }),
    body: () => ({
      version: 1,
      note: 'Rechecked',
      data: { method: 'checking-springs', intake: [{ crankAngle: -8, clearance: 0.21, valveLift: 0.05 }], exhaust: [{ crankAngle: 8, clearance: 0.19 }] },
    }),
  },
  'DELETE /api/measurements/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.measurementId }) },

  'GET /api/jobs/:jobId/photos': { allow: shopAReaders, params: job },
  'POST /api/jobs/:jobId/photos': { allow: shopAReaders, params: job, body: () => formWith([['photos', 'lobe.png', PNG, 'image/png']]) },
  'GET /api/photos/:id/file': { allow: shopAReaders, params: (w) => ({ id: w.a.photoId }) },
  'PATCH /api/photos/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.photoId }), body: () => ({ shareable: true }) },
  'DELETE /api/photos/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.photoId }) },

  'GET /api/jobs/:jobId/checklist': { allow: shopAReaders, params: job },
  'POST /api/jobs/:jobId/checklist': { allow: shopAReaders, params: job, body: () => ({ label: 'Oil primed' }) },
  'PATCH /api/checklist/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.checklistItemId }), body: () => ({ done: true }) },
  'DELETE /api/checklist/:id': { allow: shopAReaders, params: (w) => ({ id: w.a.checklistItemId }) },

  'GET /api/shop/limits': { allow: bothShopsReaders },
  'PUT /api/shop/limits': {
    allow: bothBuilders,
    // Each builder saves their own shop's limits: A saved once already, B never.
    body: (w, who) => ({ version: who === 'A.builder' ? w.a.limitsVersion : 0, limits: { coilBind: { min: 0.05 } } }),
  },

  'GET /api/sheets/:id/fit-checks': { allow: shopAReaders, params: sheet },
  'POST /api/sheets/:id/fit-checks': { allow: shopAReaders, params: sheet },

  'GET /api/grinding-shops': { allow: bothBuilders },
  'POST /api/sheets/:id/issue': {
    allow: builderA,
    params: (w) => ({ id: w.a.draftSheetId }),
    body: (w) => ({ version: w.a.draftSheetVersion, grinderShopId: w.g2.shopId }),
  },
  'GET /api/sheets/:id/orders': { allow: shopAReaders, params: sheet },
  'GET /api/incoming': { allow: ['G1.grinder', 'G2.grinder'], query: () => 'limit=200' },
  'GET /api/orders/:id': { allow: orderReaders, params: order },
  'POST /api/orders/:id/move': {
    // The grinder quotes; A's builder is on the order but may not quote (409 illegal move); a tech may not move (403).
    allow: ['A.builder', 'G1.grinder'],
    params: order,
    body: (w) => ({ version: w.a.orderVersion, to: 'quoted', quote: { priceCents: 18_500, leadTimeDays: 6 } }),
  },
  'POST /api/orders/:id/confirm': {
    // Only a builder of the repair shop makes a request for a quote firm without the owner; the grinder and a tech are refused.
    allow: builderA,
    params: order,
    body: (w) => ({ version: w.a.orderVersion, reason: 'Fleet account: signed off by phone' }),
  },
  'GET /api/orders/:id/messages': { allow: orderReaders, params: order },
  'POST /api/orders/:id/messages': { allow: orderReaders, params: order, body: () => ({ body: 'Core is at the counter' }) },

  'GET /api/jobs/:jobId/owner': { allow: shopAReaders, params: job },
  'PUT /api/jobs/:jobId/owner': { allow: builderA, params: job, body: (w) => ({ version: w.a.ownerPageVersion, whatFailed: 'The cam lobe wore flat' }) },
  'POST /api/jobs/:jobId/owner/options': {
    allow: builderA,
    params: job,
    body: (w) => ({ sheetId: w.a.sheetId, title: 'Test second option', priceCents: 50_000, depositCents: 10_000, leadTimeDays: 4 }),
  },
  'PATCH /api/owner-options/:id': { allow: builderA, params: option, body: (w) => ({ version: w.a.optionVersion, priceCents: 80_000 }) },
  'DELETE /api/owner-options/:id': { allow: builderA, params: option },
  'POST /api/jobs/:jobId/share-links': { allow: builderA, params: job, body: () => ({ expiresInDays: 7 }) },
  'POST /api/share-links/:id/revoke': { allow: builderA, params: (w) => ({ id: w.a.shareLinkId }) },

  ...ownerRoutes('/api/share/:token', actors, byToken, token, paidToken),
  // Each customer lists their own summaries: B's is empty, and the markers check it shows nothing of A's.
  'GET /api/my/jobs': { allow: ['A.customer', 'B.customer'], ownerPage: byAccount, query: () => 'limit=200' },
  ...ownerRoutes('/api/my/jobs/:jobId', ['A.customer'], byAccount, job, paidJob),

  'POST /api/payments/webhook': {
    allow: [],
    refusedAs: { status: 400, why: 'only the payment service holds the signing secret; a signed event is tested on its own in matrix.test.ts' },
  },

  // A shop's team: its builder (repair) or grinder (grinding) manages it, each in their own shop.
  'GET /api/shop/team': { allow: teamManagers },
  'POST /api/shop/invitations': {
    allow: teamManagers,
    body: (_w, who) => ({ email: `invited-${who.replace('.', '-').toLowerCase()}@example.test`, role: who.startsWith('G') ? 'grinder' : 'tech' }),
  },
  'DELETE /api/shop/invitations/:id': { allow: builderA, params: (w) => ({ id: w.a.pendingInvitationId }) },
  'PATCH /api/shop/members/:id': { allow: builderA, params: (w) => ({ id: w.a.techMemberId }), body: () => ({ role: 'builder' }) },
  'DELETE /api/shop/members/:id': { allow: builderA, params: (w) => ({ id: w.a.techMemberId }) },
  // Mail about the shop that failed after every try: its team manager sees it and sends it again.
  'GET /api/shop/mail-failures': { allow: teamManagers },
  'POST /api/shop/mail-failures/:id/retry': { allow: builderA, params: (w) => ({ id: w.a.failedMailId }) },
  // An invitation, as the person it was sent to opens it.
  'GET /api/invitations/:id': { allow: ['B.tech'], params: bTechInvitation, showsEveryone: invitedSees },
  'POST /api/invitations/:id/accept': {
    allow: ['B.tech'],
    params: bTechInvitation,
    showsEveryone: invitedSees,
    changesShopA: "accepting makes B's tech a member of A, as A asked",
  },
  'POST /api/invitations/:id/decline': {
    allow: ['B.tech'],
    params: bTechInvitation,
    showsEveryone: invitedSees,
    changesShopA: "declining closes A's invitation",
  },

  // The development mailbox (demo mode only): each person reads only the mail addressed to them.
  'GET /api/dev/outbox': {
    allow: signedIn,
    showsEveryone:
      'each person reads only the mail addressed to them (orders.test.ts checks a stranger sees none of it), and that mail names the records it is about',
  },
  'GET /api/dev/outbox/:id': { allow: ['A.builder'], params: (w) => ({ id: w.a.outboxId }) },
};

/**
 * Routes the matrix does not call, each with the reason. better-auth answers
 * everything under /api/auth itself (sign-up, sign-in, sessions), with its own tests.
 */
export const notInMatrix: { prefix: string; why: string }[] = [
  { prefix: '/api/auth/', why: "better-auth's own routes (sign-up, sign-in, sign-out, sessions)" },
];

/**
 * Plain middleware under /api (not a route or a router): each answers no request of
 * its own, or only the API's 404. A new one must be made a route, or listed here with why.
 */
export const apiMiddleware: { path: string; name: string; why: string }[] = [
  { path: '/api', name: 'jsonParser', why: 'parses JSON bodies, answers nothing itself (malformed JSON goes to the error handler)' },
  { path: '/api', name: '<anonymous>', why: 'the JSON 404 for paths no route matched' },
  { path: '/api/share', name: '<anonymous>', why: "the share pages' per-address rate limit: answers 429 only when an address makes too many calls" },
];

/** The route path with its parameters filled in; throws when the row leaves one out. */
export function fillPath(path: string, params: Record<string, string>): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => {
    const value = params[name];
    if (value === undefined) throw new Error(`The matrix row for ${path} has no value for :${name}`);
    return encodeURIComponent(value);
  });
}

/** True for paths the matrix leaves to another suite (see `notInMatrix`). */
export const notCalled = (path: string) => notInMatrix.some((e) => path.startsWith(e.prefix));

/**
 * The route table of the app as `createApp` builds it (the development tools on unless asked otherwise):
 * every API route the matrix must have a row for, and all plain middleware.
 */
export function appRoutes(devTools = true) {
  const table = routeTable(createApp({ db: openDb(':memory:'), baseURL: 'http://127.0.0.1', secret: 'test-secret-test-secret-test-secret', devTools }));
  return { all: table.routes, api: table.routes.filter((r) => isApiPath(r.path) && !notCalled(r.path)), middleware: table.middleware };
}
