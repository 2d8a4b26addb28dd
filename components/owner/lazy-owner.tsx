import { Pending } from '@/components/ui/query-state';
import { lazyView } from '@/components/ui/lazy-view';

/*
 * The owner's page reaches the screens through one import() of ./owner-views, so its parts form one
 * chunk that the owner's and the desk's screens fetch, and stay out of the first load.
 */
const loadOwner = () => import('./owner-views');
const loading = () => <Pending label="Loading the owner's page…" />;

/** The owner's summary (components/owner/owner-summary.tsx), from a share link or the owner's account. */
export const OwnerSummary = lazyView(() => loadOwner().then((m) => m.OwnerSummary), loading);

/** The owner's page as the builder sees it on the job screen (components/owner/owner-desk.tsx). */
export const OwnerSection = lazyView(() => loadOwner().then((m) => m.OwnerSection), loading);

/** The builder's side of the owner's page (components/owner/owner-desk-screen.tsx). */
export const OwnerDeskScreen = lazyView(() => loadOwner().then((m) => m.OwnerDeskScreen), loading);
