import express, { type RequestHandler } from 'express';
import helmet from 'helmet';

import type { ApiErrorBody } from '@/shared/errors';

import { HttpError } from './http';

/** Largest JSON body the API reads. */
export const jsonBodyLimit = '200kb';
/** Largest body the sign-in routes read (e-mail, password, a name, a shop: a few hundred bytes in practice). */
export const authBodyLimit = '64kb';

/** One rule: at most `max` requests from one address per `window` seconds. */
export type RateRule = { max: number; window: number };

/** Attempts one network address may make on the sign-in routes. */
export type AuthRateLimit = {
  signIn: RateRule;
  signUp: RateRule;
  /** Every other sign-in route (session, sign-out, shops). */
  other: RateRule;
};

/**
 * On in production and under `npm run serve`. Ten sign-ins a minute lets a
 * whole shop behind one address sign in at the start of a shift, and stops a
 * password guesser at ten tries.
 */
export const defaultAuthRateLimit: AuthRateLimit = {
  signIn: { max: 10, window: 60 },
  signUp: { max: 5, window: 600 },
  other: { max: 100, window: 60 },
};

/**
 * Header that carries the client's address to better-auth, which reads
 * addresses only from headers. Always overwritten from `req.ip` (which
 * honours the app's `trust proxy` setting), so a client cannot choose its
 * own rate-limit bucket by sending it.
 */
export const clientAddressHeader = 'x-lobewright-client-address';

export const setClientAddress: RequestHandler = (req, _res, next) => {
  req.headers[clientAddressHeader] = req.ip ?? req.socket.remoteAddress ?? '';
  next();
};

/**
 * Reads a sign-in route's body with a size limit (better-auth itself reads
 * any size) and hands it on as text, which better-auth parses as it would the
 * raw stream. A larger body is a 413 from the app's error handler.
 */
export const authBodyParser = express.text({ type: () => true, limit: authBodyLimit, inflate: false });

/** Wraps better-auth's handler so its 429 answers come in the app's error shape, with the standard Retry-After header. */
export function withRateLimitAnswers(handler: (request: Request) => Promise<Response>) {
  return async (request: Request) => rateLimitAnswer(await handler(request));
}

async function rateLimitAnswer(response: Response): Promise<Response> {
  if (response.status !== 429) return response;
  const seconds = Math.max(1, Number(response.headers.get('x-retry-after')) || 60);
  const body: ApiErrorBody = {
    error: {
      code: 'rate_limited',
      message: `Too many attempts from your network in a short time. Wait ${seconds} seconds, then try again.`,
    },
  };
  return Response.json(body, { status: 429, headers: { 'retry-after': String(seconds) } });
}

export type SecurityHeaderOptions = {
  /** Public origin; HTTPS turns on HSTS and upgrade-insecure-requests. */
  baseURL: string;
  /** Off while proxying the Expo dev server, whose live reload needs more than the export does. */
  contentSecurityPolicy?: boolean;
};

/**
 * helmet's headers with a Content Security Policy the web export runs under:
 * scripts only from our origin (route chunks load as same-origin script tags),
 * inline styles (react-native-web and the export's reset stylesheet write
 * style elements), fonts from our assets, photos from our API or picked on
 * the device (data: and blob: URLs), and no framing.
 */
export function securityHeaders({ baseURL, contentSecurityPolicy = true }: SecurityHeaderOptions): RequestHandler {
  const https = baseURL.startsWith('https://');
  return helmet({
    contentSecurityPolicy: contentSecurityPolicy
      ? {
          useDefaults: false,
          directives: {
            defaultSrc: ["'self'"],
            baseUri: ["'self'"],
            connectSrc: ["'self'"],
            fontSrc: ["'self'", 'data:'],
            formAction: ["'self'"],
            frameAncestors: ["'none'"],
            imgSrc: ["'self'", 'data:', 'blob:'],
            objectSrc: ["'none'"],
            scriptSrc: ["'self'"],
            scriptSrcAttr: ["'none'"],
            styleSrc: ["'self'", "'unsafe-inline'"],
            ...(https ? { upgradeInsecureRequests: [] } : {}),
          },
        }
      : false,
    strictTransportSecurity: https ? { maxAge: 180 * 24 * 60 * 60, includeSubDomains: true } : false,
    frameguard: { action: 'deny' },
  });
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses a state-changing request that carries cookies unless its Origin (or, when a
 * browser sends none, its Referer) is the app's own, the way the sign-in library checks
 * its own routes. A page on another site can make the browser send our cookie with a
 * form post, a text/plain body or no body at all; it cannot make it send our origin.
 * Requests without cookies act as nobody (a share link's token is in its address).
 */
export function requireSameOrigin(baseURL: string): RequestHandler {
  const own = new URL(baseURL).origin;
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || !req.headers.cookie) return next();
    const claimed = req.headers.origin || originOfReferer(req.headers.referer);
    if (claimed === own) return next();
    const why = claimed ? `Requests from ${claimed} cannot act here` : 'The request does not say which site sent it (no Origin header)';
    next(new HttpError(403, 'origin_refused', `${why}: open Lobewright at ${own} and try again`, { origin: why }));
  };
}

function originOfReferer(referer: string | undefined): string | undefined {
  if (!referer) return undefined;
  try {
    return new URL(referer).origin;
  } catch {
    return undefined;
  }
}
