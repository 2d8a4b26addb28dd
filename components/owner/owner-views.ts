/**
 * The owner's page, loaded as one chunk (see ./lazy-owner.tsx): the owner's summary (share link and
 * signed-in owner), the builder's desk screen and the desk's section on the job screen share most of
 * their parts, so they come from this one module, not from each route's own chunk.
 */
export { OwnerSummary } from './owner-summary';
export { OwnerSection } from './owner-desk';
export { OwnerDeskScreen } from './owner-desk-screen';
