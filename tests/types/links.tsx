/**
 * Typed routes, checked by `npm run typecheck` (which generates Expo Router's route types first).
 * Each `@ts-expect-error` fails the typecheck if the line below it ever compiles, so a link to a
 * route that does not exist, or a dynamic route without its parameter, stays a type error.
 */
import { Link, type Href } from 'expo-router';

export const existing: Href[] = ['/jobs', '/incoming', { pathname: '/jobs/[id]', params: { id: 'job-1' } }];

// @ts-expect-error no route is called /no-such-page
export const missing: Href = '/no-such-page';

// @ts-expect-error a dynamic route needs its parameter
export const withoutParam: Href = { pathname: '/orders/[id]', params: {} };

export function LinkToMissingRoute() {
  return (
    // @ts-expect-error a <Link> to a route that does not exist
    <Link href="/nowhere">Nowhere</Link>
  );
}
